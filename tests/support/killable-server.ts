import { spawn, type ChildProcess } from 'node:child_process';
import { childEnv, repoRoot } from '../../server/config';
import { freePort } from '../../scripts/free-port';

// The real server (scripts/dev-api.ts) in a process of its own, so a test can kill it with
// SIGKILL or take its database away and watch what a client sees.

export type ServerProcess = {
  url: string;
  pid: number;
  /** Resolves with the exit signal or code once the process has ended. */
  exited: Promise<string>;
  kill: (signal: NodeJS.Signals) => void;
  /** Everything the process wrote to stderr, for a failure message. */
  stderr: () => string;
};

/** Environment for a server process under test: test password cost, no rate limit in the way. */
export function serverEnv(overrides: Record<string, string>): Record<string, string> {
  return {
    NODE_ENV: 'test',
    HOST: '127.0.0.1',
    QB_PASSWORD_COST: 'test',
    QB_RATE_LIMIT_MAX: '100000',
    QB_LOG_REQUESTS: '0',
    ...overrides,
  };
}

export async function startServerProcess(env: Record<string, string>): Promise<ServerProcess> {
  const port = env.PORT ?? String(await freePort());
  // node --import tsx: one process, so a signal reaches the server itself (npx would sit between).
  const child: ChildProcess = spawn(process.execPath, ['--import', 'tsx', 'scripts/dev-api.ts'], {
    cwd: repoRoot,
    stdio: ['ignore', 'pipe', 'pipe'],
    env: childEnv({ ...env, PORT: port }),
  });
  let errors = '';
  child.stderr!.on('data', (chunk: Buffer) => {
    errors = (errors + chunk.toString()).slice(-20_000);
  });
  const exited = new Promise<string>((resolve) => {
    child.once('exit', (code, signal) => resolve(signal ?? String(code)));
  });
  await new Promise<void>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`server did not start:\n${errors}`)), 90_000);
    child.stdout!.on('data', (chunk: Buffer) => {
      if (chunk.toString().includes('API listening')) {
        clearTimeout(timer);
        resolve();
      }
    });
    void exited.then((how) => {
      clearTimeout(timer);
      reject(new Error(`server exited (${how}) before listening:\n${errors}`));
    });
  });
  return {
    url: `http://127.0.0.1:${port}`,
    pid: child.pid!,
    exited,
    kill: (signal) => {
      if (child.exitCode === null && child.signalCode === null) child.kill(signal);
    },
    stderr: () => errors,
  };
}

export type Reply = { status: number; ms: number; json: unknown; headers: Headers };

/** One JSON request with a deadline, so a hung server shows as a failure rather than a stall. */
export async function call(
  url: string,
  path: string,
  options: { method?: string; body?: unknown; token?: string; deadlineMs?: number } = {},
): Promise<Reply> {
  const started = performance.now();
  const res = await fetch(`${url}${path}`, {
    method: options.method ?? 'GET',
    headers: {
      ...(options.body === undefined ? {} : { 'Content-Type': 'application/json' }),
      ...(options.token ? { Authorization: `Bearer ${options.token}` } : {}),
    },
    body: options.body === undefined ? undefined : JSON.stringify(options.body),
    signal: AbortSignal.timeout(options.deadlineMs ?? 15_000),
  });
  const text = await res.text();
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch {
    json = undefined;
  }
  return { status: res.status, ms: performance.now() - started, json, headers: res.headers };
}

/** Signs up through the API and returns a bearer token and the new lab's id. */
export async function signUpThrough(url: string, email: string, password: string) {
  const up = await call(url, '/api/auth/sign-up', {
    method: 'POST',
    body: { email, password, displayName: 'Fault Tester', labName: 'Fault lab' },
  });
  if (up.status !== 201) throw new Error(`sign-up: ${up.status} ${JSON.stringify(up.json)}`);
  const labId = (up.json as { me: { labs: { id: string }[] } }).me.labs[0]!.id;
  const signIn = await call(url, '/api/auth/sign-in', {
    method: 'POST',
    body: { email, password, tokenDelivery: 'body' },
  });
  return { token: (signIn.json as { accessToken: string }).accessToken, labId };
}
