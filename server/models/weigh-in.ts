import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type NonAttribute,
  type Sequelize,
} from 'sequelize';
import type { ChemicalModel } from './chemical';

export class WeighInModel extends Model<
  InferAttributes<WeighInModel>,
  InferCreationAttributes<WeighInModel>
> {
  declare id: CreationOptional<string>;
  declare batchId: string;
  declare chemicalId: string;
  declare position: number;
  declare targetG: number;
  declare weighedG: number;
  declare lot: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare chemical?: NonAttribute<ChemicalModel>;

  static initModel(sequelize: Sequelize): void {
    WeighInModel.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        batchId: { type: DataTypes.UUID, allowNull: false },
        chemicalId: { type: DataTypes.UUID, allowNull: false },
        position: { type: DataTypes.INTEGER, allowNull: false },
        targetG: { type: DataTypes.DOUBLE, allowNull: false },
        weighedG: { type: DataTypes.DOUBLE, allowNull: false },
        lot: { type: DataTypes.TEXT, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'weigh_ins', modelName: 'WeighIn' },
    );
  }
}
