import { DataTypes, type QueryInterface } from 'sequelize';
import { reference as ref, timestamp as stamp, uuidKey as id } from '../migration-columns';

const num = (allowNull = true) => ({ type: DataTypes.DOUBLE, allowNull });
const text = (allowNull = true) => ({ type: DataTypes.TEXT, allowNull });
const check = (table: string, column: string, values: string[]) =>
  `ALTER TABLE ${table} ADD CONSTRAINT ${table}_${column}_check CHECK (${column} IN (${values.map((v) => `'${v}'`).join(', ')}))`;

export async function up(qi: QueryInterface): Promise<void> {
  await qi.sequelize.transaction(async (transaction) => {
    const opts = { transaction };
    await qi.addColumn('specimens', 'conditioning', text(), opts);

    await qi.createTable(
      'burn_sessions',
      {
        id: id(qi),
        lab_id: ref('labs', 'CASCADE'),
        client_id: { type: DataTypes.UUID, allowNull: false },
        held_at: { type: DataTypes.DATE, allowNull: false },
        place: text(false),
        operator_id: ref('users', 'SET NULL', true),
        second_person: text(),
        ambient_temp_c: num(),
        ambient_rh_pct: num(),
        draft: text(false),
        wind: text(),
        igniter: text(false),
        igniter_detail: text(),
        exposure_s: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 12 },
        orientation: text(false),
        checklist: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
        checklist_completed_at: { type: DataTypes.DATE, allowNull: true },
        checklist_completed_by: ref('users', 'SET NULL', true),
        notes: text(),
        created_at: stamp(qi),
        updated_at: stamp(qi),
      },
      opts,
    );
    await qi.addIndex('burn_sessions', ['lab_id', 'client_id'], { unique: true, ...opts });
    await qi.sequelize.query(
      check('burn_sessions', 'draft', ['hood', 'enclosure', 'open_air']),
      opts,
    );
    await qi.sequelize.query(
      check('burn_sessions', 'igniter', [
        'match',
        'butane_lighter',
        'bunsen',
        'propane_torch',
        'other',
      ]),
      opts,
    );
    await qi.sequelize.query(
      check('burn_sessions', 'orientation', ['vertical', 'angle_45', 'horizontal']),
      opts,
    );

    await qi.createTable(
      'burn_pairs',
      {
        id: id(qi),
        lab_id: ref('labs', 'CASCADE'),
        session_id: ref('burn_sessions', 'CASCADE'),
        client_id: { type: DataTypes.UUID, allowNull: false },
        control_specimen_id: ref('specimens', 'RESTRICT'),
        treated_specimen_id: ref('specimens', 'RESTRICT'),
        mode: text(false),
        status: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'draft' },
        review_comment: text(),
        submitted_at: { type: DataTypes.DATE, allowNull: true },
        submitted_by: ref('users', 'SET NULL', true),
        signed_off_at: { type: DataTypes.DATE, allowNull: true },
        signed_off_by: ref('users', 'SET NULL', true),
        created_at: stamp(qi),
        updated_at: stamp(qi),
      },
      opts,
    );
    await qi.addIndex('burn_pairs', ['lab_id', 'client_id'], { unique: true, ...opts });
    await qi.addIndex('burn_pairs', ['session_id'], opts);
    await qi.addIndex('burn_pairs', ['lab_id', 'status'], opts);
    await qi.sequelize.query(
      check('burn_pairs', 'status', ['draft', 'submitted', 'signed_off', 'returned']),
      opts,
    );
    await qi.sequelize.query(check('burn_pairs', 'mode', ['simultaneous', 'sequential']), opts);
    // A specimen burns once: it can be in one pair only.
    await qi.addIndex('burn_pairs', ['control_specimen_id'], { unique: true, ...opts });
    await qi.addIndex('burn_pairs', ['treated_specimen_id'], { unique: true, ...opts });

    // The client makes each mark's id, so a mark sent twice is stored once.
    await qi.createTable(
      'marks',
      {
        id: { type: DataTypes.UUID, primaryKey: true },
        lab_id: ref('labs', 'CASCADE'),
        pair_id: ref('burn_pairs', 'CASCADE'),
        specimen_id: ref('specimens', 'RESTRICT'),
        kind: text(false),
        at_ms: num(false),
        undoes: { type: DataTypes.UUID, allowNull: true },
        recorded_by: ref('users', 'SET NULL', true),
        created_at: stamp(qi),
      },
      opts,
    );
    await qi.addIndex('marks', ['pair_id', 'specimen_id', 'at_ms'], opts);

    await qi.createTable(
      'measurements',
      {
        id: id(qi),
        lab_id: ref('labs', 'CASCADE'),
        pair_id: ref('burn_pairs', 'CASCADE'),
        specimen_id: ref('specimens', 'RESTRICT'),
        char_length_mm: num(),
        char_width_mm: num(),
        mass_before_g: num(),
        mass_after_g: num(),
        flaming_drips: { type: DataTypes.BOOLEAN, allowNull: true },
        notes: text(),
        created_at: stamp(qi),
        updated_at: stamp(qi),
      },
      opts,
    );
    await qi.addIndex('measurements', ['pair_id', 'specimen_id'], { unique: true, ...opts });

    await qi.createTable(
      'photos',
      {
        id: { type: DataTypes.UUID, primaryKey: true },
        lab_id: ref('labs', 'CASCADE'),
        pair_id: ref('burn_pairs', 'CASCADE'),
        specimen_id: ref('specimens', 'RESTRICT'),
        stage: text(false),
        width: { type: DataTypes.INTEGER, allowNull: false },
        height: { type: DataTypes.INTEGER, allowNull: false },
        bytes: { type: DataTypes.INTEGER, allowNull: false },
        uploaded_by: ref('users', 'SET NULL', true),
        created_at: stamp(qi),
      },
      opts,
    );
    await qi.addIndex('photos', ['pair_id'], opts);
    await qi.sequelize.query(check('photos', 'stage', ['before', 'after']), opts);
  });
}

export async function down(qi: QueryInterface): Promise<void> {
  for (const table of ['photos', 'measurements', 'marks', 'burn_pairs', 'burn_sessions']) {
    await qi.dropTable(table);
  }
  await qi.removeColumn('specimens', 'conditioning');
}
