import { spawn } from 'node:child_process';
import path from 'node:path';
import { childEnv, repoRoot } from '../../server/config';
import { freePort } from '../../scripts/free-port';

export type ServerProcess = { url: string; stop: () => Promise<void> };

/**
 * The API server in a process of its own (scripts/dev-api.ts), as one instance of a deployment:
 * nothing in this test process's memory is shared with it.
 */
export async function startServerProcess(env: Record<string, string>): Promise<ServerProcess> {
  const port = await freePort();
  const child = spawn(path.join(repoRoot, 'node_modules/.bin/tsx'), ['scripts/dev-api.ts'], {
    cwd: repoRoot,
    // Its own process group, so stopping reaches every process it started.
    detached: true,
    stdio: ['ignore', 'pipe', 'pipe'],
    env: childEnv({ ...env, HOST: '127.0.0.1', PORT: String(port), QB_LOG_REQUESTS: '0' }),
  });
  let output = '';
  const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
  await new Promise<void>((resolve, reject) => {
    const read = (chunk: Buffer) => {
      output += chunk.toString();
      if (output.includes('API listening')) resolve();
    };
    child.stdout.on('data', read);
    child.stderr.on('data', read);
    child.once('exit', (code) => reject(new Error(`server exited with ${code}:\n${output}`)));
  });
  return {
    url: `http://127.0.0.1:${port}`,
    stop: async () => {
      if (child.exitCode === null && child.pid) process.kill(-child.pid, 'SIGTERM');
      await exited;
    },
  };
}
