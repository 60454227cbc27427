import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

/** One timed event in a specimen's lane; its id is made by the client, so a resend is a no-op. */
export class MarkModel extends Model<
  InferAttributes<MarkModel>,
  InferCreationAttributes<MarkModel>
> {
  declare id: string;
  declare labId: string;
  declare pairId: string;
  declare specimenId: string;
  declare kind: string;
  declare atMs: number;
  declare undoes: string | null;
  declare recordedBy: string | null;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    MarkModel.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true },
        labId: { type: DataTypes.UUID, allowNull: false },
        pairId: { type: DataTypes.UUID, allowNull: false },
        specimenId: { type: DataTypes.UUID, allowNull: false },
        kind: { type: DataTypes.TEXT, allowNull: false },
        atMs: { type: DataTypes.DOUBLE, allowNull: false },
        undoes: { type: DataTypes.UUID, allowNull: true },
        recordedBy: { type: DataTypes.UUID, allowNull: true },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'marks', modelName: 'Mark', updatedAt: false },
    );
  }
}
