import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type NonAttribute,
  type Sequelize,
} from 'sequelize';
import type { AuditAction } from '../../shared/schemas/audit';
import type { UserModel } from './user';

export class AuditEventModel extends Model<
  InferAttributes<AuditEventModel>,
  InferCreationAttributes<AuditEventModel>
> {
  declare id: CreationOptional<string>;
  declare labId: string | null;
  declare actorId: string | null;
  declare targetUserId: string | null;
  declare action: AuditAction;
  declare ip: string | null;
  declare detail: CreationOptional<Record<string, unknown>>;
  declare createdAt: CreationOptional<Date>;
  declare actor?: NonAttribute<UserModel | null>;
  declare target?: NonAttribute<UserModel | null>;

  static initModel(sequelize: Sequelize): void {
    AuditEventModel.init(
      {
        id: { type: DataTypes.BIGINT, primaryKey: true, autoIncrement: true },
        labId: { type: DataTypes.UUID, allowNull: true },
        actorId: { type: DataTypes.UUID, allowNull: true },
        targetUserId: { type: DataTypes.UUID, allowNull: true },
        action: { type: DataTypes.TEXT, allowNull: false },
        ip: { type: DataTypes.TEXT, allowNull: true },
        detail: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'audit_events', modelName: 'AuditEvent', updatedAt: false },
    );
  }
}
