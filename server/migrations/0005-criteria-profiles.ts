import { DataTypes, type QueryInterface } from 'sequelize';
import { reference as ref, timestamp as stamp, uuidKey as id } from '../migration-columns';

export async function up(qi: QueryInterface): Promise<void> {
  await qi.sequelize.transaction(async (transaction) => {
    const opts = { transaction };
    await qi.createTable(
      'criteria_profiles',
      {
        id: id(qi),
        lab_id: ref('labs', 'CASCADE'),
        name: { type: DataTypes.TEXT, allowNull: false },
        description: { type: DataTypes.TEXT, allowNull: true },
        source: { type: DataTypes.TEXT, allowNull: true },
        preset_key: { type: DataTypes.TEXT, allowNull: true },
        min_specimens: { type: DataTypes.INTEGER, allowNull: false },
        exposure_s: { type: DataTypes.DOUBLE, allowNull: true },
        rules: { type: DataTypes.JSONB, allowNull: false },
        created_at: stamp(qi),
        updated_at: stamp(qi),
      },
      opts,
    );
    await qi.sequelize.query(
      'CREATE UNIQUE INDEX criteria_profiles_lab_name ON criteria_profiles (lab_id, lower(name))',
      opts,
    );
    await qi.addColumn(
      'burn_sessions',
      'criteria_profile_id',
      ref('criteria_profiles', 'SET NULL', true),
      opts,
    );
  });
}

export async function down(qi: QueryInterface): Promise<void> {
  await qi.removeColumn('burn_sessions', 'criteria_profile_id');
  await qi.dropTable('criteria_profiles');
}
