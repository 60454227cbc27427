import type { Sequelize } from 'sequelize';
import { AuditEventModel } from './audit-event';
import { BatchModel } from './batch';
import { BurnPairModel } from './burn-pair';
import { BurnSessionModel } from './burn-session';
import { ChemicalModel } from './chemical';
import { CriteriaProfileModel } from './criteria-profile';
import { IngredientModel } from './ingredient';
import { InvitationModel } from './invitation';
import { LabModel } from './lab';
import { MarkModel } from './mark';
import { MeasurementModel } from './measurement';
import { MembershipModel } from './membership';
import { PairImportModel } from './pair-import';
import { PasswordResetModel } from './password-reset';
import { PhotoModel } from './photo';
import { RateLimitModel } from './rate-limit';
import { RecipeModel } from './recipe';
import { RecipeRevisionModel } from './recipe-revision';
import { SessionModel } from './session';
import { SpecimenModel } from './specimen';
import { UserModel } from './user';
import { WeighInModel } from './weigh-in';

export {
  AuditEventModel,
  BatchModel,
  BurnPairModel,
  BurnSessionModel,
  MarkModel,
  MeasurementModel,
  PhotoModel,
  RateLimitModel,
  ChemicalModel,
  CriteriaProfileModel,
  IngredientModel,
  RecipeModel,
  RecipeRevisionModel,
  SpecimenModel,
  WeighInModel,
  InvitationModel,
  LabModel,
  MembershipModel,
  PairImportModel,
  PasswordResetModel,
  SessionModel,
  UserModel,
};

export function initModels(sequelize: Sequelize): void {
  for (const model of [
    LabModel,
    UserModel,
    MembershipModel,
    SessionModel,
    PasswordResetModel,
    InvitationModel,
    AuditEventModel,
    ChemicalModel,
    RecipeModel,
    RecipeRevisionModel,
    IngredientModel,
    BatchModel,
    WeighInModel,
    SpecimenModel,
    BurnSessionModel,
    BurnPairModel,
    MarkModel,
    MeasurementModel,
    PhotoModel,
    CriteriaProfileModel,
    PairImportModel,
    RateLimitModel,
  ]) {
    model.initModel(sequelize);
  }
  MembershipModel.belongsTo(LabModel, { foreignKey: 'labId', as: 'lab' });
  MembershipModel.belongsTo(UserModel, { foreignKey: 'userId', as: 'user' });
  InvitationModel.belongsTo(LabModel, { foreignKey: 'labId', as: 'lab' });
  InvitationModel.belongsTo(UserModel, { foreignKey: 'invitedBy', as: 'inviter' });
  AuditEventModel.belongsTo(UserModel, { foreignKey: 'actorId', as: 'actor' });
  AuditEventModel.belongsTo(UserModel, { foreignKey: 'targetUserId', as: 'target' });
  RecipeModel.hasMany(RecipeRevisionModel, { foreignKey: 'recipeId', as: 'revisions' });
  RecipeRevisionModel.belongsTo(RecipeModel, { foreignKey: 'recipeId', as: 'recipe' });
  RecipeRevisionModel.hasMany(IngredientModel, { foreignKey: 'revisionId', as: 'ingredients' });
  RecipeRevisionModel.belongsTo(UserModel, { foreignKey: 'createdBy', as: 'author' });
  IngredientModel.belongsTo(ChemicalModel, { foreignKey: 'chemicalId', as: 'chemical' });
  BatchModel.belongsTo(RecipeRevisionModel, { foreignKey: 'revisionId', as: 'revision' });
  BatchModel.belongsTo(UserModel, { foreignKey: 'operatorId', as: 'operator' });
  BatchModel.hasMany(WeighInModel, { foreignKey: 'batchId', as: 'weighIns' });
  BatchModel.hasMany(SpecimenModel, { foreignKey: 'batchId', as: 'specimens' });
  WeighInModel.belongsTo(ChemicalModel, { foreignKey: 'chemicalId', as: 'chemical' });
  SpecimenModel.belongsTo(BatchModel, { foreignKey: 'batchId', as: 'batch' });
  BurnSessionModel.hasMany(BurnPairModel, { foreignKey: 'sessionId', as: 'pairs' });
  BurnSessionModel.belongsTo(UserModel, { foreignKey: 'operatorId', as: 'operator' });
  BurnSessionModel.belongsTo(CriteriaProfileModel, {
    foreignKey: 'criteriaProfileId',
    as: 'criteriaProfile',
  });
  BurnPairModel.belongsTo(BurnSessionModel, { foreignKey: 'sessionId', as: 'session' });
  BurnPairModel.belongsTo(SpecimenModel, { foreignKey: 'controlSpecimenId', as: 'control' });
  BurnPairModel.belongsTo(SpecimenModel, { foreignKey: 'treatedSpecimenId', as: 'treated' });
}
