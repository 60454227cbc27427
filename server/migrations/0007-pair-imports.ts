import { DataTypes, type QueryInterface } from 'sequelize';
import { reference as ref, timestamp as stamp, uuidKey as id } from '../migration-columns';

// A previewed pairs file waits here, not in a server's memory: any instance may take the accept.
export async function up(qi: QueryInterface): Promise<void> {
  await qi.sequelize.transaction(async (transaction) => {
    const opts = { transaction };
    await qi.createTable(
      'pair_imports',
      {
        id: id(qi),
        lab_id: ref('labs', 'CASCADE'),
        created_by: ref('users', 'SET NULL', true),
        file_name: { type: DataTypes.TEXT, allowNull: false },
        status: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'pending' },
        /** The valid rows resolved against the lab, and the batches to make for them. */
        pending: { type: DataTypes.JSONB, allowNull: true },
        valid_count: { type: DataTypes.INTEGER, allowNull: false },
        error_count: { type: DataTypes.INTEGER, allowNull: false },
        /** The answer to the accept, repeated to a retried accept. */
        result: { type: DataTypes.JSONB, allowNull: true },
        expires_at: { type: DataTypes.DATE, allowNull: false },
        accepted_at: { type: DataTypes.DATE, allowNull: true },
        accepted_by: ref('users', 'SET NULL', true),
        created_at: stamp(qi),
        updated_at: stamp(qi),
      },
      opts,
    );
    await qi.addIndex('pair_imports', ['lab_id', 'status'], opts);
    await qi.sequelize.query(
      "ALTER TABLE pair_imports ADD CONSTRAINT pair_imports_status_check CHECK (status IN ('pending', 'accepted', 'discarded'))",
      opts,
    );
    await qi.addColumn('burn_sessions', 'import_id', ref('pair_imports', 'SET NULL', true), opts);
  });
}

export async function down(qi: QueryInterface): Promise<void> {
  await qi.removeColumn('burn_sessions', 'import_id');
  await qi.dropTable('pair_imports');
}
