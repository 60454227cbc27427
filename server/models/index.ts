import type { Sequelize } from 'sequelize';
import { AuditEventModel } from './audit-event';
import { InvitationModel } from './invitation';
import { LabModel } from './lab';
import { MembershipModel } from './membership';
import { PasswordResetModel } from './password-reset';
import { SessionModel } from './session';
import { UserModel } from './user';

export {
  AuditEventModel,
  InvitationModel,
  LabModel,
  MembershipModel,
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
  ]) {
    model.initModel(sequelize);
  }
  MembershipModel.belongsTo(LabModel, { foreignKey: 'labId', as: 'lab' });
  MembershipModel.belongsTo(UserModel, { foreignKey: 'userId', as: 'user' });
  InvitationModel.belongsTo(LabModel, { foreignKey: 'labId', as: 'lab' });
  InvitationModel.belongsTo(UserModel, { foreignKey: 'invitedBy', as: 'inviter' });
  AuditEventModel.belongsTo(UserModel, { foreignKey: 'actorId', as: 'actor' });
  AuditEventModel.belongsTo(UserModel, { foreignKey: 'targetUserId', as: 'target' });
}
