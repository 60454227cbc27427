import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

export class ChemicalModel extends Model<
  InferAttributes<ChemicalModel>,
  InferCreationAttributes<ChemicalModel>
> {
  declare id: CreationOptional<string>;
  declare labId: string | null;
  declare referenceKey: string | null;
  declare name: string;
  declare formula: string | null;
  declare molarMass: number | null;
  declare boronFraction: number | null;
  declare hydrateWaterFraction: CreationOptional<number>;
  declare anhydrousMolarMass: number | null;
  declare borateGroup: 'borax' | 'boric_acid' | null;
  declare hazards: CreationOptional<{ code: string; text: string }[]>;
  declare cautions: CreationOptional<string[]>;
  declare solubility: unknown;
  declare notes: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    ChemicalModel.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        labId: { type: DataTypes.UUID, allowNull: true },
        referenceKey: { type: DataTypes.TEXT, allowNull: true },
        name: { type: DataTypes.TEXT, allowNull: false },
        formula: { type: DataTypes.TEXT, allowNull: true },
        molarMass: { type: DataTypes.DOUBLE, allowNull: true },
        boronFraction: { type: DataTypes.DOUBLE, allowNull: true },
        hydrateWaterFraction: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 0 },
        anhydrousMolarMass: { type: DataTypes.DOUBLE, allowNull: true },
        borateGroup: { type: DataTypes.TEXT, allowNull: true },
        hazards: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
        cautions: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
        solubility: { type: DataTypes.JSONB, allowNull: true },
        notes: { type: DataTypes.TEXT, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'chemicals', modelName: 'Chemical' },
    );
  }
}
