import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import type { BatchPlanOutput } from '../../shared/schemas/batch';
import type { PairImportResult, PairImportRow } from '../../shared/schemas/pair-import';

export type PairImportStatus = 'pending' | 'accepted' | 'discarded';

/** A valid row, resolved against the lab when the file was previewed. */
export type PendingPairRow = {
  line: number;
  values: PairImportRow;
  revisionId: string;
  /** An existing batch of the lab, or one this import makes (by its key in `batches`). */
  batch: { id: string } | { newKey: string };
  /** Its code, for the preview. */
  batchCode: string;
  controlCode: string;
  treatedCode: string;
};

/** A batch made elsewhere, recorded so the imported treated specimens belong to one. */
export type PendingBatch = {
  key: string;
  code: string;
  revisionId: string;
  preparedAt: string;
  storageTempC: number;
  plan: BatchPlanOutput;
};

export type PendingImport = { rows: PendingPairRow[]; batches: PendingBatch[] };

export class PairImportModel extends Model<
  InferAttributes<PairImportModel>,
  InferCreationAttributes<PairImportModel>
> {
  declare id: string;
  declare labId: string;
  declare createdBy: string | null;
  declare fileName: string;
  declare status: CreationOptional<PairImportStatus>;
  declare pending: PendingImport | null;
  declare validCount: number;
  declare errorCount: number;
  declare result: CreationOptional<PairImportResult | null>;
  declare expiresAt: Date;
  declare acceptedAt: CreationOptional<Date | null>;
  declare acceptedBy: CreationOptional<string | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    PairImportModel.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true },
        labId: { type: DataTypes.UUID, allowNull: false },
        createdBy: { type: DataTypes.UUID, allowNull: true },
        fileName: { type: DataTypes.TEXT, allowNull: false },
        status: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'pending' },
        pending: { type: DataTypes.JSONB, allowNull: true },
        validCount: { type: DataTypes.INTEGER, allowNull: false },
        errorCount: { type: DataTypes.INTEGER, allowNull: false },
        result: { type: DataTypes.JSONB, allowNull: true },
        expiresAt: { type: DataTypes.DATE, allowNull: false },
        acceptedAt: { type: DataTypes.DATE, allowNull: true },
        acceptedBy: { type: DataTypes.UUID, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'pair_imports', modelName: 'PairImport' },
    );
  }
}
