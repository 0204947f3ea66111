// The server as `npm start` runs it: `node --import tsx server/index.ts` in its own process, on a
// loopback port, serving the built client from dist/client. The browser tests and the page bench
// drive this process, not an app built inside the test runner.
import { spawn, type ChildProcess } from 'node:child_process';
import { createServer } from 'node:net';

export interface AppProcess {
  baseUrl: string;
  port: number;
  /** everything the server printed, for error messages */
  output(): string;
  stop(): Promise<void>;
}

/** A free TCP port on loopback (the OS picks it; a race with another process is unlikely). */
export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = createServer();
    s.once('error', reject);
    s.listen(0, '127.0.0.1', () => {
      const { port } = s.address() as { port: number };
      s.close(() => resolve(port));
    });
  });
}

export async function startAppProcess(opts: { databaseUrl: string; env?: Record<string, string>; readyTimeoutMs?: number }): Promise<AppProcess> {
  const port = await freePort();
  let out = '';
  const child: ChildProcess = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
    env: {
      ...process.env,
      // what scripts/start.sh gives the server; loopback only, mail captured on any free port
      NODE_ENV: 'development',
      DATABASE_URL: opts.databaseUrl,
      HOST: '127.0.0.1',
      PORT: String(port),
      SMTP_CAPTURE_PORT: '0',
      SMTP_URL: '',
      PUBLIC_URL: `http://127.0.0.1:${port}`,
      LOGIN_RATE_LIMIT: '1000',
      ...opts.env,
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  child.stdout!.on('data', (d) => (out += d));
  child.stderr!.on('data', (d) => (out += d));
  const exited = new Promise<number | null>((r) => child.once('exit', (code) => r(code)));
  await new Promise<void>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`the server did not start within ${opts.readyTimeoutMs ?? 60_000} ms:\n${out}`)), opts.readyTimeoutMs ?? 60_000);
    const onData = () => {
      if (out.includes('Placewright is running at')) {
        clearTimeout(timer);
        resolve();
      }
    };
    child.stdout!.on('data', onData);
    void exited.then((code) => {
      clearTimeout(timer);
      reject(new Error(`the server exited (${code}) before it was ready:\n${out}`));
    });
  });
  return {
    baseUrl: `http://127.0.0.1:${port}`,
    port,
    output: () => out,
    async stop() {
      if (child.exitCode !== null) return;
      child.kill('SIGTERM');
      const killer = setTimeout(() => child.kill('SIGKILL'), 5000);
      await exited;
      clearTimeout(killer);
    },
  };
}
