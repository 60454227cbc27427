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
import type { Substrate } from '../../shared/schemas/recipe';

export class RecipeModel extends Model<
  InferAttributes<RecipeModel>,
  InferCreationAttributes<RecipeModel>
> {
  declare id: CreationOptional<string>;
  declare labId: string;
  declare name: string;
  declare substrate: Substrate;
  declare createdBy: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare revisions?: NonAttribute<RecipeRevisionModel[]>;

  static initModel(sequelize: Sequelize): void {
    RecipeModel.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        labId: { type: DataTypes.UUID, allowNull: false },
        name: { type: DataTypes.TEXT, allowNull: false },
        substrate: { type: DataTypes.TEXT, allowNull: false },
        createdBy: { type: DataTypes.UUID, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'recipes', modelName: 'Recipe' },
    );
  }
}
