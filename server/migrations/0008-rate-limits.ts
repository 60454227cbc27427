import { DataTypes, type QueryInterface } from 'sequelize';

// Rate-limit counters live in the database, so every server instance counts the same tries.
export async function up(qi: QueryInterface): Promise<void> {
  await qi.sequelize.transaction(async (transaction) => {
    await qi.createTable(
      'rate_limits',
      {
        key: { type: DataTypes.TEXT, primaryKey: true },
        hits: { type: DataTypes.INTEGER, allowNull: false },
        reset_at: { type: DataTypes.DATE, allowNull: false },
      },
      { transaction },
    );
    // For sweeping out windows that have ended.
    await qi.addIndex('rate_limits', ['reset_at'], { transaction });
  });
}

export async function down(qi: QueryInterface): Promise<void> {
  await qi.dropTable('rate_limits');
}
