import { DataTypes, type QueryInterface } from 'sequelize';
import { reference as ref, timestamp as stamp, uuidKey as id } from '../migration-columns';

const num = (allowNull = true) => ({ type: DataTypes.DOUBLE, allowNull });
const text = (allowNull = true) => ({ type: DataTypes.TEXT, allowNull });

export async function up(qi: QueryInterface): Promise<void> {
  await qi.sequelize.transaction(async (transaction) => {
    const opts = { transaction };
    await qi.addColumn(
      'labs',
      'weigh_tolerance_pct',
      { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 2 },
      opts,
    );

    // Reference chemicals have no lab (shared by all); a lab's own have its lab_id.
    await qi.createTable(
      'chemicals',
      {
        id: id(qi),
        lab_id: ref('labs', 'CASCADE', true),
        reference_key: text(),
        name: text(false),
        formula: text(),
        molar_mass: num(),
        boron_fraction: num(),
        hydrate_water_fraction: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 0 },
        anhydrous_molar_mass: num(),
        borate_group: text(),
        hazards: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
        cautions: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
        solubility: { type: DataTypes.JSONB, allowNull: true },
        notes: text(),
        created_at: stamp(qi),
        updated_at: stamp(qi),
      },
      opts,
    );
    await qi.sequelize.query(
      'CREATE UNIQUE INDEX chemicals_reference_key ON chemicals (reference_key) WHERE lab_id IS NULL',
      opts,
    );
    await qi.sequelize.query(
      'CREATE UNIQUE INDEX chemicals_lab_name ON chemicals (lab_id, lower(name)) WHERE lab_id IS NOT NULL',
      opts,
    );

    await qi.createTable(
      'recipes',
      {
        id: id(qi),
        lab_id: ref('labs', 'CASCADE'),
        name: text(false),
        substrate: text(false),
        created_by: ref('users', 'SET NULL', true),
        created_at: stamp(qi),
        updated_at: stamp(qi),
      },
      opts,
    );
    await qi.addIndex('recipes', ['lab_id'], opts);

    await qi.createTable(
      'recipe_revisions',
      {
        id: id(qi),
        recipe_id: ref('recipes', 'CASCADE'),
        number: { type: DataTypes.INTEGER, allowNull: false },
        water_parts: num(),
        mixing_temp_c: num(false),
        soak_minutes: num(false),
        drain_minutes: num(),
        drying_method: text(false),
        drying_minutes: num(),
        drying_temp_c: num(),
        drying_rh_pct: num(),
        conditioning: text(),
        notes: text(),
        created_by: ref('users', 'SET NULL', true),
        created_at: stamp(qi),
        updated_at: stamp(qi),
      },
      opts,
    );
    await qi.addIndex('recipe_revisions', ['recipe_id', 'number'], { unique: true, ...opts });

    await qi.createTable(
      'ingredients',
      {
        id: id(qi),
        revision_id: ref('recipe_revisions', 'CASCADE'),
        chemical_id: ref('chemicals', 'RESTRICT'),
        position: { type: DataTypes.INTEGER, allowNull: false },
        amount: num(false),
        unit: text(false),
        g_per_100g_water: num(false),
        created_at: stamp(qi),
        updated_at: stamp(qi),
      },
      opts,
    );
    await qi.addIndex('ingredients', ['revision_id', 'chemical_id'], { unique: true, ...opts });

    await qi.createTable(
      'batches',
      {
        id: id(qi),
        lab_id: ref('labs', 'CASCADE'),
        revision_id: ref('recipe_revisions', 'RESTRICT'),
        code: text(false),
        client_id: { type: DataTypes.UUID, allowNull: false },
        operator_id: ref('users', 'SET NULL', true),
        prepared_at: stamp(qi),
        target: { type: DataTypes.JSONB, allowNull: false },
        storage_temp_c: num(false),
        water_temp_c: num(),
        ph: num(),
        density_g_ml: num(),
        tolerance_pct: num(false),
        status: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'prepared' },
        discard_reason: text(),
        cautions_acknowledged_at: { type: DataTypes.DATE, allowNull: false },
        soak_started_at: { type: DataTypes.DATE, allowNull: true },
        plan: { type: DataTypes.JSONB, allowNull: false },
        notes: text(),
        created_at: stamp(qi),
        updated_at: stamp(qi),
      },
      opts,
    );
    await qi.addIndex('batches', ['lab_id', 'code'], { unique: true, ...opts });
    await qi.addIndex('batches', ['lab_id', 'client_id'], { unique: true, ...opts });
    await qi.sequelize.query(
      "ALTER TABLE batches ADD CONSTRAINT batches_status_check CHECK (status IN ('prepared', 'in_use', 'used_up', 'discarded'))",
      opts,
    );

    await qi.createTable(
      'weigh_ins',
      {
        id: id(qi),
        batch_id: ref('batches', 'CASCADE'),
        chemical_id: ref('chemicals', 'RESTRICT'),
        position: { type: DataTypes.INTEGER, allowNull: false },
        target_g: num(false),
        weighed_g: num(false),
        lot: text(),
        created_at: stamp(qi),
        updated_at: stamp(qi),
      },
      opts,
    );

    await qi.createTable(
      'specimens',
      {
        id: id(qi),
        lab_id: ref('labs', 'CASCADE'),
        batch_id: ref('batches', 'RESTRICT', true),
        client_id: { type: DataTypes.UUID, allowNull: false },
        code: text(false),
        substrate: text(false),
        length_mm: num(),
        width_mm: num(),
        thickness_mm: num(),
        dry_mass_before_g: num(false),
        wet_mass_g: num(),
        dry_mass_after_g: num(),
        notes: text(),
        created_at: stamp(qi),
        updated_at: stamp(qi),
      },
      opts,
    );
    await qi.addIndex('specimens', ['lab_id', 'code'], { unique: true, ...opts });
    await qi.addIndex('specimens', ['lab_id', 'client_id'], { unique: true, ...opts });
    await qi.addIndex('specimens', ['batch_id'], opts);
  });
}

export async function down(qi: QueryInterface): Promise<void> {
  for (const table of [
    'specimens',
    'weigh_ins',
    'batches',
    'ingredients',
    'recipe_revisions',
    'recipes',
    'chemicals',
  ]) {
    await qi.dropTable(table);
  }
  await qi.removeColumn('labs', 'weigh_tolerance_pct');
}
