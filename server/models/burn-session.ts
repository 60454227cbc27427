import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type NonAttribute,
  type Sequelize,
} from 'sequelize';
import type { BurnPairModel } from './burn-pair';
import type { CriteriaProfileModel } from './criteria-profile';
import type { UserModel } from './user';

export class BurnSessionModel extends Model<
  InferAttributes<BurnSessionModel>,
  InferCreationAttributes<BurnSessionModel>
> {
  declare id: CreationOptional<string>;
  declare labId: string;
  declare clientId: string;
  declare heldAt: Date;
  declare place: string;
  declare operatorId: string | null;
  declare secondPerson: string | null;
  declare ambientTempC: number | null;
  declare ambientRhPct: number | null;
  declare draft: string;
  declare wind: string | null;
  declare igniter: string;
  declare igniterDetail: string | null;
  declare exposureS: number;
  declare orientation: string;
  declare checklist: CreationOptional<Record<string, boolean>>;
  declare checklistCompletedAt: Date | null;
  declare checklistCompletedBy: string | null;
  declare notes: string | null;
  declare criteriaProfileId: CreationOptional<string | null>;
  /** Set when the session was made from an imported pairs file. */
  declare importId: CreationOptional<string | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare pairs?: NonAttribute<BurnPairModel[]>;
  declare operator?: NonAttribute<UserModel | null>;
  declare criteriaProfile?: NonAttribute<CriteriaProfileModel | null>;

  static initModel(sequelize: Sequelize): void {
    BurnSessionModel.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        labId: { type: DataTypes.UUID, allowNull: false },
        clientId: { type: DataTypes.UUID, allowNull: false },
        heldAt: { type: DataTypes.DATE, allowNull: false },
        place: { type: DataTypes.TEXT, allowNull: false },
        operatorId: { type: DataTypes.UUID, allowNull: true },
        secondPerson: { type: DataTypes.TEXT, allowNull: true },
        ambientTempC: { type: DataTypes.DOUBLE, allowNull: true },
        ambientRhPct: { type: DataTypes.DOUBLE, allowNull: true },
        draft: { type: DataTypes.TEXT, allowNull: false },
        wind: { type: DataTypes.TEXT, allowNull: true },
        igniter: { type: DataTypes.TEXT, allowNull: false },
        igniterDetail: { type: DataTypes.TEXT, allowNull: true },
        exposureS: { type: DataTypes.DOUBLE, allowNull: false },
        orientation: { type: DataTypes.TEXT, allowNull: false },
        checklist: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
        checklistCompletedAt: { type: DataTypes.DATE, allowNull: true },
        checklistCompletedBy: { type: DataTypes.UUID, allowNull: true },
        notes: { type: DataTypes.TEXT, allowNull: true },
        criteriaProfileId: { type: DataTypes.UUID, allowNull: true },
        importId: { type: DataTypes.UUID, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'burn_sessions', modelName: 'BurnSession' },
    );
  }
}
