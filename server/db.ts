import pg from 'pg';
import { Sequelize } from 'sequelize';
import { initModels } from './models';

export function createSequelize(databaseUrl: string): Sequelize {
  const sequelize = new Sequelize(databaseUrl, {
    dialect: 'postgres',
    dialectModule: pg,
    logging: false,
    define: { underscored: true },
    pool: { max: 10, min: 0, idle: 10_000, acquire: 10_000 },
  });
  initModels(sequelize);
  return sequelize;
}

/** True when the database answers a trivial query within the timeout. */
export async function databaseIsUp(sequelize: Sequelize, timeoutMs: number): Promise<boolean> {
  let timer: ReturnType<typeof setTimeout> | undefined;
  const timeout = new Promise<false>((resolve) => {
    timer = setTimeout(() => resolve(false), timeoutMs);
  });
  const probe = sequelize.query('SELECT 1').then(
    () => true,
    () => false,
  );
  try {
    return await Promise.race([probe, timeout]);
  } finally {
    clearTimeout(timer);
  }
}
