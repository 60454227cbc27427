import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type NonAttribute,
  type Sequelize,
} from 'sequelize';
import type { BurnSessionModel } from './burn-session';
import type { SpecimenModel } from './specimen';
import type { PairStatus } from '../../shared/schemas/burn';

export class BurnPairModel extends Model<
  InferAttributes<BurnPairModel>,
  InferCreationAttributes<BurnPairModel>
> {
  declare id: CreationOptional<string>;
  declare labId: string;
  declare sessionId: string;
  declare clientId: string;
  declare controlSpecimenId: string;
  declare treatedSpecimenId: string;
  declare mode: string;
  declare status: CreationOptional<PairStatus>;
  declare reviewComment: string | null;
  declare submittedAt: Date | null;
  declare submittedBy: string | null;
  declare signedOffAt: Date | null;
  declare signedOffBy: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare session?: NonAttribute<BurnSessionModel>;
  declare control?: NonAttribute<SpecimenModel>;
  declare treated?: NonAttribute<SpecimenModel>;

  static initModel(sequelize: Sequelize): void {
    BurnPairModel.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        labId: { type: DataTypes.UUID, allowNull: false },
        sessionId: { type: DataTypes.UUID, allowNull: false },
        clientId: { type: DataTypes.UUID, allowNull: false },
        controlSpecimenId: { type: DataTypes.UUID, allowNull: false },
        treatedSpecimenId: { type: DataTypes.UUID, allowNull: false },
        mode: { type: DataTypes.TEXT, allowNull: false },
        status: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'draft' },
        reviewComment: { type: DataTypes.TEXT, allowNull: true },
        submittedAt: { type: DataTypes.DATE, allowNull: true },
        submittedBy: { type: DataTypes.UUID, allowNull: true },
        signedOffAt: { type: DataTypes.DATE, allowNull: true },
        signedOffBy: { type: DataTypes.UUID, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'burn_pairs', modelName: 'BurnPair' },
    );
  }
}
