import { spawn } from 'node:child_process';
import { createServer, type AddressInfo } from 'node:net';

/**
 * A second web process (a real child, WEB_ONLY) on a free port, on the same MariaDB and Redis as
 * the test: it inherits the environment, so it shares the test's database and counter scope.
 */
export async function startWebProcess(extraEnv: Record<string, string> = {}): Promise<{ url: string; stop(): Promise<void> }> {
  const port = await new Promise<number>((resolve) => {
    const probe = createServer().listen(0, '127.0.0.1', () => {
      const p = (probe.address() as AddressInfo).port;
      probe.close(() => resolve(p));
    });
  });
  // Not a test process: it must not inherit the test runner's context.
  const { NODE_TEST_CONTEXT: _context, ...env } = process.env;
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/main.ts'], {
    env: { ...env, PORT: String(port), HOST: '127.0.0.1', WEB_ONLY: 'true', LOG_LEVEL: 'warn', ...extraEnv },
    stdio: ['ignore', 'ignore', 'pipe'],
  });
  let stderr = '';
  child.stderr.on('data', (d: Buffer) => (stderr += d.toString()));
  const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
  const url = `http://127.0.0.1:${port}`;
  for (let i = 0; ; i++) {
    if (child.exitCode !== null) throw new Error(`the second web process exited: ${stderr}`);
    const up = await fetch(`${url}/api/health`).then(
      (r) => r.ok,
      () => false,
    );
    if (up) break;
    if (i > 600) throw new Error(`the second web process did not start in 60 s: ${stderr}`);
    await new Promise((r) => setTimeout(r, 100));
  }
  return {
    url,
    stop: async () => {
      child.kill('SIGTERM');
      await exited;
    },
  };
}
