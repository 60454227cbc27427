import type { QueryInterface } from 'sequelize';

// A counter per lab that moves whenever data a ranking reads changes, so a ranking computed once
// can be served again until then (server/services/ranking-cache.ts). Triggers, not service code,
// so no write path (imports, corrections, raw SQL) can forget it.
//
// The triggers are DEFERRABLE INITIALLY DEFERRED: the counter row is updated at commit, after the
// transaction's other writes, so it is always the last lock taken and cannot join a deadlock.
// Marks and measurements of pairs that no ranking counts yet (draft, returned) leave it alone:
// timing a session does not throw away the rankings others are reading.
const TABLES = [
  'recipes',
  'batches',
  'specimens',
  'burn_sessions',
  'burn_pairs',
  'measurements',
  'marks',
  'criteria_profiles',
];

const UP = `
CREATE TABLE lab_data_versions (
  lab_id uuid PRIMARY KEY REFERENCES labs(id) ON DELETE CASCADE,
  version bigint NOT NULL DEFAULT 0
);
INSERT INTO lab_data_versions (lab_id) SELECT id FROM labs;

CREATE FUNCTION qb_add_lab_data_version() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  INSERT INTO lab_data_versions (lab_id) VALUES (NEW.id) ON CONFLICT DO NOTHING;
  RETURN NULL;
END $$;
CREATE TRIGGER labs_add_data_version AFTER INSERT ON labs
  FOR EACH ROW EXECUTE FUNCTION qb_add_lab_data_version();

CREATE FUNCTION qb_bump_lab_data_version() RETURNS trigger LANGUAGE plpgsql AS $$
DECLARE
  row_lab uuid;
  row_pair uuid;
  done_flag text;
BEGIN
  IF TG_OP = 'DELETE' THEN
    row_lab := OLD.lab_id;
  ELSE
    row_lab := NEW.lab_id;
  END IF;
  -- One move per lab per transaction is enough, and keeps a bulk import from updating the
  -- same row tens of thousands of times at commit.
  done_flag := 'qb.data_version_' || replace(row_lab::text, '-', '');
  IF current_setting(done_flag, true) = 'moved' THEN
    RETURN NULL;
  END IF;
  IF TG_TABLE_NAME IN ('marks', 'measurements') THEN
    IF TG_OP = 'DELETE' THEN row_pair := OLD.pair_id; ELSE row_pair := NEW.pair_id; END IF;
    IF NOT EXISTS (SELECT 1 FROM burn_pairs p
                   WHERE p.id = row_pair AND p.status IN ('submitted', 'signed_off')) THEN
      RETURN NULL;
    END IF;
  END IF;
  UPDATE lab_data_versions SET version = version + 1 WHERE lab_id = row_lab;
  PERFORM set_config(done_flag, 'moved', true);
  RETURN NULL;
END $$;
`;

const trigger = (table: string) => `
CREATE CONSTRAINT TRIGGER ${table}_bump_lab_data_version
  AFTER INSERT OR UPDATE OR DELETE ON ${table}
  DEFERRABLE INITIALLY DEFERRED
  FOR EACH ROW EXECUTE FUNCTION qb_bump_lab_data_version();`;

export async function up(qi: QueryInterface): Promise<void> {
  await qi.sequelize.transaction(async (transaction) => {
    await qi.sequelize.query(UP + TABLES.map(trigger).join('\n'), { transaction });
  });
}

export async function down(qi: QueryInterface): Promise<void> {
  await qi.sequelize.transaction(async (transaction) => {
    const drops = TABLES.map((t) => `DROP TRIGGER ${t}_bump_lab_data_version ON ${t};`).join('\n');
    await qi.sequelize.query(
      `${drops}
       DROP TRIGGER labs_add_data_version ON labs;
       DROP FUNCTION qb_bump_lab_data_version();
       DROP FUNCTION qb_add_lab_data_version();
       DROP TABLE lab_data_versions;`,
      { transaction },
    );
  });
}
