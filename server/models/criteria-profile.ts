import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import type { Rule } from '../../shared/criteria/types';

/** A lab's own pass rules, often copied from a preset and then edited. */
export class CriteriaProfileModel extends Model<
  InferAttributes<CriteriaProfileModel>,
  InferCreationAttributes<CriteriaProfileModel>
> {
  declare id: CreationOptional<string>;
  declare labId: string;
  declare name: string;
  declare description: string | null;
  declare source: string | null;
  declare presetKey: string | null;
  declare minSpecimens: number;
  declare exposureS: number | null;
  declare rules: Rule[];
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    CriteriaProfileModel.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        labId: { type: DataTypes.UUID, allowNull: false },
        name: { type: DataTypes.TEXT, allowNull: false },
        description: { type: DataTypes.TEXT, allowNull: true },
        source: { type: DataTypes.TEXT, allowNull: true },
        presetKey: { type: DataTypes.TEXT, allowNull: true },
        minSpecimens: { type: DataTypes.INTEGER, allowNull: false },
        exposureS: { type: DataTypes.DOUBLE, allowNull: true },
        rules: { type: DataTypes.JSONB, allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'criteria_profiles', modelName: 'CriteriaProfile' },
    );
  }
}
