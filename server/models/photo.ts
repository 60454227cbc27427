import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

/** A stored photo's record; the id is the client's, and names the files in the photo store. */
export class PhotoModel extends Model<
  InferAttributes<PhotoModel>,
  InferCreationAttributes<PhotoModel>
> {
  declare id: string;
  declare labId: string;
  declare pairId: string;
  declare specimenId: string;
  declare stage: 'before' | 'after';
  declare width: number;
  declare height: number;
  declare bytes: number;
  declare uploadedBy: string | null;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    PhotoModel.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true },
        labId: { type: DataTypes.UUID, allowNull: false },
        pairId: { type: DataTypes.UUID, allowNull: false },
        specimenId: { type: DataTypes.UUID, allowNull: false },
        stage: { type: DataTypes.TEXT, allowNull: false },
        width: { type: DataTypes.INTEGER, allowNull: false },
        height: { type: DataTypes.INTEGER, allowNull: false },
        bytes: { type: DataTypes.INTEGER, allowNull: false },
        uploadedBy: { type: DataTypes.UUID, allowNull: true },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'photos', modelName: 'Photo', updatedAt: false },
    );
  }
}
