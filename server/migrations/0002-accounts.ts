import { DataTypes, type QueryInterface } from 'sequelize';
import { reference as ref, timestamp as stamp, uuidKey as id } from '../migration-columns';

export async function up(qi: QueryInterface): Promise<void> {
  await qi.sequelize.transaction(async (transaction) => {
    const opts = { transaction };
    await qi.createTable(
      'users',
      {
        id: id(qi),
        email: { type: DataTypes.TEXT, allowNull: false },
        display_name: { type: DataTypes.TEXT, allowNull: false },
        password_hash: { type: DataTypes.TEXT, allowNull: false },
        units: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'metric' },
        created_at: stamp(qi),
        updated_at: stamp(qi),
      },
      opts,
    );
    await qi.sequelize.query('CREATE UNIQUE INDEX users_email_key ON users (lower(email))', opts);
    await qi.sequelize.query(
      "ALTER TABLE users ADD CONSTRAINT users_units_check CHECK (units IN ('metric', 'us'))",
      opts,
    );

    await qi.createTable(
      'memberships',
      {
        id: id(qi),
        lab_id: ref('labs', 'CASCADE'),
        user_id: ref('users', 'CASCADE'),
        role: { type: DataTypes.TEXT, allowNull: false },
        created_at: stamp(qi),
        updated_at: stamp(qi),
      },
      opts,
    );
    await qi.addIndex('memberships', ['lab_id', 'user_id'], { unique: true, ...opts });
    await qi.addIndex('memberships', ['user_id'], opts);
    await qi.sequelize.query(
      "ALTER TABLE memberships ADD CONSTRAINT memberships_role_check CHECK (role IN ('manager', 'technician', 'reviewer', 'viewer'))",
      opts,
    );

    await qi.createTable(
      'sessions',
      {
        id: id(qi),
        user_id: ref('users', 'CASCADE'),
        refresh_token_hash: { type: DataTypes.TEXT, allowNull: false, unique: true },
        user_agent: { type: DataTypes.TEXT, allowNull: true },
        ip: { type: DataTypes.TEXT, allowNull: true },
        expires_at: { type: DataTypes.DATE, allowNull: false },
        last_used_at: stamp(qi),
        revoked_at: { type: DataTypes.DATE, allowNull: true },
        created_at: stamp(qi),
        updated_at: stamp(qi),
      },
      opts,
    );
    await qi.addIndex('sessions', ['user_id'], opts);

    await qi.createTable(
      'password_resets',
      {
        id: id(qi),
        user_id: ref('users', 'CASCADE'),
        token_hash: { type: DataTypes.TEXT, allowNull: false, unique: true },
        expires_at: { type: DataTypes.DATE, allowNull: false },
        used_at: { type: DataTypes.DATE, allowNull: true },
        created_at: stamp(qi),
        updated_at: stamp(qi),
      },
      opts,
    );

    await qi.createTable(
      'invitations',
      {
        id: id(qi),
        lab_id: ref('labs', 'CASCADE'),
        email: { type: DataTypes.TEXT, allowNull: false },
        role: { type: DataTypes.TEXT, allowNull: false },
        token_hash: { type: DataTypes.TEXT, allowNull: false, unique: true },
        invited_by: ref('users', 'SET NULL', true),
        expires_at: { type: DataTypes.DATE, allowNull: false },
        accepted_at: { type: DataTypes.DATE, allowNull: true },
        revoked_at: { type: DataTypes.DATE, allowNull: true },
        created_at: stamp(qi),
        updated_at: stamp(qi),
      },
      opts,
    );
    await qi.addIndex('invitations', ['lab_id'], opts);
    await qi.sequelize.query(
      "ALTER TABLE invitations ADD CONSTRAINT invitations_role_check CHECK (role IN ('manager', 'technician', 'reviewer', 'viewer'))",
      opts,
    );

    await qi.createTable(
      'audit_events',
      {
        id: { type: DataTypes.BIGINT, primaryKey: true, autoIncrement: true },
        lab_id: ref('labs', 'CASCADE', true),
        actor_id: ref('users', 'SET NULL', true),
        target_user_id: ref('users', 'SET NULL', true),
        action: { type: DataTypes.TEXT, allowNull: false },
        ip: { type: DataTypes.TEXT, allowNull: true },
        detail: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
        created_at: stamp(qi),
      },
      opts,
    );
    await qi.addIndex('audit_events', ['lab_id', 'created_at'], opts);
    await qi.addIndex('audit_events', ['actor_id', 'created_at'], opts);
  });
}

export async function down(qi: QueryInterface): Promise<void> {
  for (const table of [
    'audit_events',
    'invitations',
    'password_resets',
    'sessions',
    'memberships',
    'users',
  ]) {
    await qi.dropTable(table);
  }
}
