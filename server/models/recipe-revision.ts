import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type NonAttribute,
  type Sequelize,
} from 'sequelize';
import type { IngredientModel } from './ingredient';
import type { RecipeModel } from './recipe';
import type { UserModel } from './user';

export class RecipeRevisionModel extends Model<
  InferAttributes<RecipeRevisionModel>,
  InferCreationAttributes<RecipeRevisionModel>
> {
  declare id: CreationOptional<string>;
  declare recipeId: string;
  declare number: number;
  declare waterParts: number | null;
  declare mixingTempC: number;
  declare soakMinutes: number;
  declare drainMinutes: number | null;
  declare dryingMethod: string;
  declare dryingMinutes: number | null;
  declare dryingTempC: number | null;
  declare dryingRhPct: number | null;
  declare conditioning: string | null;
  declare notes: string | null;
  declare createdBy: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare recipe?: NonAttribute<RecipeModel>;
  declare ingredients?: NonAttribute<IngredientModel[]>;
  declare author?: NonAttribute<UserModel | null>;

  static initModel(sequelize: Sequelize): void {
    RecipeRevisionModel.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        recipeId: { type: DataTypes.UUID, allowNull: false },
        number: { type: DataTypes.INTEGER, allowNull: false },
        waterParts: { type: DataTypes.DOUBLE, allowNull: true },
        mixingTempC: { type: DataTypes.DOUBLE, allowNull: false },
        soakMinutes: { type: DataTypes.DOUBLE, allowNull: false },
        drainMinutes: { type: DataTypes.DOUBLE, allowNull: true },
        dryingMethod: { type: DataTypes.TEXT, allowNull: false },
        dryingMinutes: { type: DataTypes.DOUBLE, allowNull: true },
        dryingTempC: { type: DataTypes.DOUBLE, allowNull: true },
        dryingRhPct: { type: DataTypes.DOUBLE, allowNull: true },
        conditioning: { type: DataTypes.TEXT, allowNull: true },
        notes: { type: DataTypes.TEXT, allowNull: true },
        createdBy: { type: DataTypes.UUID, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'recipe_revisions', modelName: 'RecipeRevision' },
    );
  }
}
