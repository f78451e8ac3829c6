/**
 * The real API as its own process (`server/index.ts`, as `npm start` runs it) for the tests that
 * need what supertest cannot give: a database restart under a live process, several processes
 * behind a load balancer, a SIGTERM. Same environment as the suite (DATABASE_URL, S3_*, SMTP_*),
 * its own port on loopback.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import net from 'node:net';
import path from 'node:path';
import { DEMO_PASSWORD } from '../../scripts/demo-data';

export const ROOT = path.resolve(__dirname, '..', '..');

/** A port nothing listens on right now (the kernel picks it; we let go of it at once). */
export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const probe = net.createServer();
    probe.once('error', reject);
    probe.listen(0, '127.0.0.1', () => {
      const address = probe.address();
      const port = typeof address === 'object' && address ? address.port : 0;
      probe.close(() => resolve(port));
    });
  });
}

export interface ServerProcess {
  port: number;
  url: string;
  child: ChildProcess;
  /** what the process wrote so far (pino lines), for failure messages */
  output(): string;
  /** resolves with the exit code (or the signal's name) once the process has ended */
  exited: Promise<number | string>;
  /** SIGTERM (or another signal) and wait for the exit */
  stop(signal?: NodeJS.Signals): Promise<number | string>;
}

export async function startServer(env: Record<string, string> = {}): Promise<ServerProcess> {
  const port = await freePort();
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
    cwd: ROOT,
    env: {
      ...process.env,
      TSX_TSCONFIG_PATH: 'server/tsconfig.json',
      HOST: '127.0.0.1',
      PORT: String(port),
      LOG_LEVEL: 'warn',
      ...env,
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let output = '';
  child.stdout?.on('data', (chunk: Buffer) => (output += chunk.toString()));
  child.stderr?.on('data', (chunk: Buffer) => (output += chunk.toString()));
  const exited = new Promise<number | string>((resolve) =>
    child.once('exit', (code, signal) => resolve(code ?? signal ?? 'unknown')),
  );
  const url = `http://127.0.0.1:${port}`;
  const server: ServerProcess = {
    port,
    url,
    child,
    output: () => output,
    exited,
    async stop(signal = 'SIGTERM') {
      if (child.exitCode === null && child.signalCode === null) child.kill(signal);
      return exited;
    },
  };
  // up when /api/health answers; tsx compiles on start, which takes seconds on a busy machine
  for (let i = 0; i < 240; i++) {
    if (child.exitCode !== null) throw new Error(`the API process exited on start:\n${output}`);
    try {
      const res = await fetch(`${url}/api/health`);
      if (res.ok) return server;
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  await server.stop('SIGKILL');
  throw new Error(`the API process did not answer on ${url}:\n${output}`);
}

/** Signs in a demo user at `baseUrl`; answers the session cookie (`ampwright.sid=…`). */
export async function signInCookie(baseUrl: string, role: string): Promise<string> {
  const res = await fetch(`${baseUrl}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email: `${role}@ampwright.test`, password: DEMO_PASSWORD }),
  });
  if (res.status !== 200) throw new Error(`sign-in as ${role} at ${baseUrl}: ${res.status} ${await res.text()}`);
  const cookie = res.headers.getSetCookie().find((c) => c.startsWith('ampwright.sid='));
  if (!cookie) throw new Error('sign-in set no session cookie');
  return cookie.split(';')[0];
}
