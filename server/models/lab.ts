import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

export class LabModel extends Model<InferAttributes<LabModel>, InferCreationAttributes<LabModel>> {
  declare id: CreationOptional<string>;
  declare name: string;
  declare weighTolerancePct: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    LabModel.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        name: { type: DataTypes.TEXT, allowNull: false },
        weighTolerancePct: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 2 },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'labs', modelName: 'Lab' },
    );
  }
}
