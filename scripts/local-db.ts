import type { Config } from '../server/config';
import { clusterFor, databaseUrl, ensureDatabase, startCluster, type Cluster } from './pg-cluster';

export const APP_DATABASE = 'quenchbook';

export function appCluster(config: Config): Cluster {
  return clusterFor(config.dataDir, 'dev', config.pgPort);
}

export function testCluster(config: Config): Cluster {
  return clusterFor(config.dataDir, 'test', config.pgTestPort);
}

/** The app's database: DATABASE_URL when set, else the private cluster (started if needed). */
export async function prepareAppDatabase(
  config: Config,
): Promise<{ url: string; cluster?: Cluster; started: boolean }> {
  if (config.databaseUrl) return { url: config.databaseUrl, started: false };
  const cluster = appCluster(config);
  const state = await startCluster(cluster);
  await ensureDatabase(cluster, APP_DATABASE);
  return { url: databaseUrl(cluster, APP_DATABASE), cluster, started: state === 'started' };
}
