import { DataTypes, type QueryInterface } from 'sequelize';

export async function up(qi: QueryInterface): Promise<void> {
  await qi.createTable('labs', {
    id: {
      type: DataTypes.UUID,
      primaryKey: true,
      defaultValue: qi.sequelize.literal('gen_random_uuid()'),
    },
    name: { type: DataTypes.TEXT, allowNull: false },
    created_at: {
      type: DataTypes.DATE,
      allowNull: false,
      defaultValue: qi.sequelize.literal('now()'),
    },
    updated_at: {
      type: DataTypes.DATE,
      allowNull: false,
      defaultValue: qi.sequelize.literal('now()'),
    },
  });
}

export async function down(qi: QueryInterface): Promise<void> {
  await qi.dropTable('labs');
}
