import { loadConfig } from '../server/config';
import { listen } from '../server/index';
import { createRuntime } from '../server/runtime';

// The API for the load benchmark: scripts/dev-api.ts plus its own memory, read after a full
// garbage collection, when the parent asks over the IPC channel.
async function main(): Promise<void> {
  const config = loadConfig();
  if (!config.databaseUrl) throw new Error('load-server needs DATABASE_URL');
  await listen(config, createRuntime(config, config.databaseUrl));
  process.on('message', (message) => {
    if (message !== 'memory') return;
    (globalThis as { gc?: () => void }).gc?.();
    process.send?.({ memory: process.memoryUsage() });
  });
  console.log(`API listening on http://${config.host}:${config.port}`);
}

main().catch((err: unknown) => {
  console.error(err);
  process.exit(1);
});
