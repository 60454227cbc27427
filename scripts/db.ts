import { loadConfig } from '../server/config';
import { appCluster, testCluster } from './local-db';
import { ClusterError, isRunning, startCluster, stopCluster } from './pg-cluster';

// Usage: tsx scripts/db.ts start|stop|status [--test]
async function main(): Promise<void> {
  const [command, flag] = process.argv.slice(2);
  const config = loadConfig();
  const cluster = flag === '--test' ? testCluster(config) : appCluster(config);
  const where = `"${cluster.name}" cluster on 127.0.0.1:${cluster.port} (${cluster.dir})`;
  switch (command) {
    case 'start':
      console.log(`PostgreSQL ${where}: ${await startCluster(cluster)}`);
      break;
    case 'stop':
      console.log(`PostgreSQL ${where}: ${stopCluster(cluster)}`);
      break;
    case 'status':
      console.log(`PostgreSQL ${where}: ${isRunning(cluster) ? 'running' : 'not running'}`);
      break;
    default:
      console.error('Usage: npm run db -- start|stop|status [--test]');
      process.exitCode = 2;
  }
}

main().catch((err: unknown) => {
  console.error(err instanceof ClusterError ? err.message : err);
  process.exitCode = 1;
});
