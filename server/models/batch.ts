import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type NonAttribute,
  type Sequelize,
} from 'sequelize';
import type { RecipeRevisionModel } from './recipe-revision';
import type { SpecimenModel } from './specimen';
import type { UserModel } from './user';
import type { WeighInModel } from './weigh-in';
import type { BatchPlanOutput, BatchStatus, BatchTargetInput } from '../../shared/schemas/batch';

export class BatchModel extends Model<
  InferAttributes<BatchModel>,
  InferCreationAttributes<BatchModel>
> {
  declare id: CreationOptional<string>;
  declare labId: string;
  declare revisionId: string;
  declare code: string;
  declare clientId: string;
  declare operatorId: string | null;
  declare preparedAt: CreationOptional<Date>;
  declare target: BatchTargetInput;
  declare storageTempC: number;
  declare waterTempC: number | null;
  declare ph: number | null;
  declare densityGMl: number | null;
  declare tolerancePct: number;
  declare status: CreationOptional<BatchStatus>;
  declare discardReason: string | null;
  declare cautionsAcknowledgedAt: Date;
  declare soakStartedAt: Date | null;
  declare plan: BatchPlanOutput;
  declare notes: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare revision?: NonAttribute<RecipeRevisionModel>;
  declare operator?: NonAttribute<UserModel | null>;
  declare weighIns?: NonAttribute<WeighInModel[]>;
  declare specimens?: NonAttribute<SpecimenModel[]>;

  static initModel(sequelize: Sequelize): void {
    BatchModel.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        labId: { type: DataTypes.UUID, allowNull: false },
        revisionId: { type: DataTypes.UUID, allowNull: false },
        code: { type: DataTypes.TEXT, allowNull: false },
        clientId: { type: DataTypes.UUID, allowNull: false },
        operatorId: { type: DataTypes.UUID, allowNull: true },
        preparedAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
        target: { type: DataTypes.JSONB, allowNull: false },
        storageTempC: { type: DataTypes.DOUBLE, allowNull: false },
        waterTempC: { type: DataTypes.DOUBLE, allowNull: true },
        ph: { type: DataTypes.DOUBLE, allowNull: true },
        densityGMl: { type: DataTypes.DOUBLE, allowNull: true },
        tolerancePct: { type: DataTypes.DOUBLE, allowNull: false },
        status: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'prepared' },
        discardReason: { type: DataTypes.TEXT, allowNull: true },
        cautionsAcknowledgedAt: { type: DataTypes.DATE, allowNull: false },
        soakStartedAt: { type: DataTypes.DATE, allowNull: true },
        plan: { type: DataTypes.JSONB, allowNull: false },
        notes: { type: DataTypes.TEXT, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'batches', modelName: 'Batch' },
    );
  }
}
