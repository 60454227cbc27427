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
import type { amountUnits } from '../../shared/schemas/recipe';

type AmountUnit = (typeof amountUnits)[number];

export class IngredientModel extends Model<
  InferAttributes<IngredientModel>,
  InferCreationAttributes<IngredientModel>
> {
  declare id: CreationOptional<string>;
  declare revisionId: string;
  declare chemicalId: string;
  declare position: number;
  declare amount: number;
  declare unit: AmountUnit;
  declare gPer100gWater: number;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare chemical?: NonAttribute<ChemicalModel>;

  static initModel(sequelize: Sequelize): void {
    IngredientModel.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        revisionId: { type: DataTypes.UUID, allowNull: false },
        chemicalId: { type: DataTypes.UUID, allowNull: false },
        position: { type: DataTypes.INTEGER, allowNull: false },
        amount: { type: DataTypes.DOUBLE, allowNull: false },
        unit: { type: DataTypes.TEXT, allowNull: false },
        gPer100gWater: { type: DataTypes.DOUBLE, allowNull: false, field: 'g_per_100g_water' },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'ingredients', modelName: 'Ingredient' },
    );
  }
}
