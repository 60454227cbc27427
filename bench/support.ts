import { spawn, type ChildProcess } from 'node:child_process';
import http from 'node:http';
import path from 'node:path';
import { childEnv, loadConfig, repoRoot } from '../server/config';
import { freePort } from '../scripts/free-port';
import { testCluster } from '../scripts/local-db';
import {
  databaseUrl,
  dropDatabase,
  ensureDatabase,
  startCluster,
  stopCluster,
} from '../scripts/pg-cluster';

/** A throwaway database in the tests' private cluster, for one benchmark. */
export async function benchDatabase(name: string) {
  const config = loadConfig({ ...process.env, NODE_ENV: 'test' });
  const cluster = testCluster(config);
  const started = (await startCluster(cluster)) === 'started';
  await dropDatabase(cluster, name);
  await ensureDatabase(cluster, name);
  return {
    url: databaseUrl(cluster, name),
    drop: async () => {
      await dropDatabase(cluster, name);
      if (started) stopCluster(cluster);
    },
  };
}

/** Resolves once the server process says it listens; rejects if it exits first. */
function untilListening(child: ChildProcess): Promise<void> {
  return new Promise<void>((resolve, reject) => {
    child.stdout!.on('data', (chunk: Buffer) => {
      if (chunk.toString().includes('API listening')) resolve();
    });
    child.once('exit', (code) => reject(new Error(`server exited with ${code}`)));
  });
}

/** The real server in its own process, so the load generator does not share its event loop. */
export async function startServerProcess(
  env: Record<string, string>,
): Promise<{ url: string; stop: () => void }> {
  const port = await freePort();
  const child: ChildProcess = spawn('npx', ['tsx', 'scripts/dev-api.ts'], {
    cwd: repoRoot,
    // Its own process group, so stopping reaches the node process behind npx.
    detached: true,
    stdio: ['ignore', 'pipe', 'inherit'],
    env: childEnv({ ...env, PORT: String(port), QB_LOG_REQUESTS: '0' }),
  });
  await untilListening(child);
  return {
    url: `http://127.0.0.1:${port}`,
    stop: () => {
      if (child.pid) process.kill(-child.pid, 'SIGTERM');
      agent.destroy();
    },
  };
}

const agent = new http.Agent({ keepAlive: true, maxSockets: 64 });

/** One request; resolves with its status and the time it took in milliseconds. */
export function timedRequest(
  url: string,
  options: { method?: string; body?: unknown; headers?: Record<string, string> } = {},
): Promise<{ status: number; ms: number }> {
  const started = performance.now();
  const payload = options.body === undefined ? undefined : JSON.stringify(options.body);
  return new Promise((resolve, reject) => {
    const req = http.request(
      url,
      {
        method: options.method ?? 'GET',
        agent,
        headers: {
          ...options.headers,
          ...(payload
            ? {
                'Content-Type': 'application/json',
                'Content-Length': String(Buffer.byteLength(payload)),
              }
            : {}),
        },
      },
      (res) => {
        res.resume();
        res.on('end', () =>
          resolve({ status: res.statusCode ?? 0, ms: performance.now() - started }),
        );
      },
    );
    req.on('error', reject);
    if (payload) req.write(payload);
    req.end();
  });
}

export function percentile(values: number[], p: number): number {
  const sorted = [...values].sort((a, b) => a - b);
  const index = Math.min(sorted.length - 1, Math.max(0, Math.ceil((p / 100) * sorted.length) - 1));
  return sorted[index] ?? NaN;
}

export const fmt = (ms: number) => `${ms.toFixed(1)} ms`;

/**
 * The load benchmark's server (bench/load-server.ts): node itself, not npx, so the IPC channel
 * reaches it and it can report its own memory.
 */
export async function startServerWithMemory(env: Record<string, string>): Promise<{
  url: string;
  memory: () => Promise<NodeJS.MemoryUsage>;
  stop: () => void;
}> {
  const port = await freePort();
  const child = spawn(
    process.execPath,
    ['--expose-gc', '--import', 'tsx', path.join('bench', 'load-server.ts')],
    {
      cwd: repoRoot,
      stdio: ['ignore', 'pipe', 'inherit', 'ipc'],
      env: childEnv({ ...env, PORT: String(port), QB_LOG_REQUESTS: '0' }),
    },
  );
  await untilListening(child);
  return {
    url: `http://127.0.0.1:${port}`,
    memory: () =>
      new Promise((resolve) => {
        child.once('message', (m) => resolve((m as { memory: NodeJS.MemoryUsage }).memory));
        child.send('memory');
      }),
    stop: () => child.kill('SIGTERM'),
  };
}
