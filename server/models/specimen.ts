import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type NonAttribute,
  type Sequelize,
} from 'sequelize';
import type { BatchModel } from './batch';

export class SpecimenModel extends Model<
  InferAttributes<SpecimenModel>,
  InferCreationAttributes<SpecimenModel>
> {
  declare id: CreationOptional<string>;
  declare labId: string;
  declare batchId: string | null;
  declare clientId: string;
  declare code: string;
  declare substrate: string;
  declare lengthMm: number | null;
  declare widthMm: number | null;
  declare thicknessMm: number | null;
  declare dryMassBeforeG: number;
  declare wetMassG: number | null;
  declare dryMassAfterG: number | null;
  declare notes: string | null;
  declare conditioning: CreationOptional<string | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare batch?: NonAttribute<BatchModel | null>;

  static initModel(sequelize: Sequelize): void {
    SpecimenModel.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        labId: { type: DataTypes.UUID, allowNull: false },
        batchId: { type: DataTypes.UUID, allowNull: true },
        clientId: { type: DataTypes.UUID, allowNull: false },
        code: { type: DataTypes.TEXT, allowNull: false },
        substrate: { type: DataTypes.TEXT, allowNull: false },
        lengthMm: { type: DataTypes.DOUBLE, allowNull: true },
        widthMm: { type: DataTypes.DOUBLE, allowNull: true },
        thicknessMm: { type: DataTypes.DOUBLE, allowNull: true },
        dryMassBeforeG: { type: DataTypes.DOUBLE, allowNull: false },
        wetMassG: { type: DataTypes.DOUBLE, allowNull: true },
        dryMassAfterG: { type: DataTypes.DOUBLE, allowNull: true },
        notes: { type: DataTypes.TEXT, allowNull: true },
        conditioning: { type: DataTypes.TEXT, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'specimens', modelName: 'Specimen' },
    );
  }
}
