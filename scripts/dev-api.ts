import { loadConfig } from '../server/config';
import { listen } from '../server/index';
import { createRuntime } from '../server/runtime';

// The API alone, for `npm run dev` (restarted by tsx watch on every change).
async function main(): Promise<void> {
  const config = loadConfig();
  if (!config.databaseUrl)
    throw new Error('dev-api needs DATABASE_URL; run it through `npm run dev`.');
  await listen(config, createRuntime(config, config.databaseUrl));
  console.log(`API listening on http://${config.host}:${config.port}`);
}

main().catch((err: unknown) => {
  console.error(err);
  process.exit(1);
});
