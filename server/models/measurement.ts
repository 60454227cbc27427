import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

export class MeasurementModel extends Model<
  InferAttributes<MeasurementModel>,
  InferCreationAttributes<MeasurementModel>
> {
  declare id: CreationOptional<string>;
  declare labId: string;
  declare pairId: string;
  declare specimenId: string;
  declare charLengthMm: number | null;
  declare charWidthMm: number | null;
  declare massBeforeG: number | null;
  declare massAfterG: number | null;
  declare flamingDrips: boolean | null;
  declare notes: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    MeasurementModel.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        labId: { type: DataTypes.UUID, allowNull: false },
        pairId: { type: DataTypes.UUID, allowNull: false },
        specimenId: { type: DataTypes.UUID, allowNull: false },
        charLengthMm: { type: DataTypes.DOUBLE, allowNull: true },
        charWidthMm: { type: DataTypes.DOUBLE, allowNull: true },
        massBeforeG: { type: DataTypes.DOUBLE, allowNull: true },
        massAfterG: { type: DataTypes.DOUBLE, allowNull: true },
        flamingDrips: { type: DataTypes.BOOLEAN, allowNull: true },
        notes: { type: DataTypes.TEXT, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'measurements', modelName: 'Measurement' },
    );
  }
}
