import { DataTypes, type QueryInterface } from 'sequelize';

// Column shapes the migrations share. Kept outside migrations/ so umzug does not take this
// file for a migration.

export const uuidKey = (qi: QueryInterface) => ({
  type: DataTypes.UUID,
  primaryKey: true,
  defaultValue: qi.sequelize.literal('gen_random_uuid()'),
});

export const timestamp = (qi: QueryInterface) => ({
  type: DataTypes.DATE,
  allowNull: false,
  defaultValue: qi.sequelize.literal('now()'),
});

export const reference = (
  table: string,
  onDelete: 'CASCADE' | 'SET NULL' | 'RESTRICT',
  allowNull = false,
) => ({
  type: DataTypes.UUID,
  allowNull,
  references: { model: table, key: 'id' },
  onDelete,
});
