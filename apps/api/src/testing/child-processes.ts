import type { ChildProcess } from 'node:child_process';

// Helpers of the tests that run the real server in child processes (crash recovery, two instances).

/** Polls `probe` every 100 ms until it gives a value; fails naming `what` after `timeoutMs`. */
export async function waitFor<T>(what: string, probe: () => Promise<T | undefined> | T | undefined, timeoutMs = 60_000): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const value = await probe();
    if (value !== undefined) return value;
    if (Date.now() > deadline) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

/** Sends `signal` to a child that still runs and resolves once it has exited. */
export async function kill(proc: ChildProcess, signal: NodeJS.Signals): Promise<void> {
  if (proc.exitCode !== null || proc.signalCode !== null) return;
  const exited = new Promise((resolve) => proc.once('exit', resolve));
  proc.kill(signal);
  await exited;
}

/** The environment of a real server child on loopback `port` over `dataDir`, with local mail and no payment stand-in. */
export function serverEnv(port: number, dataDir: string, extra: Record<string, string> = {}): NodeJS.ProcessEnv {
  return {
    PATH: process.env.PATH,
    NODE_ENV: 'test',
    HOST: '127.0.0.1',
    PORT: String(port),
    APP_ORIGIN: `http://127.0.0.1:${port}`,
    DATA_DIR: dataDir,
    LOCAL_SMTP: 'true',
    SMTP_PORT: '0',
    LOCAL_STRIPE: 'false',
    ...extra,
  };
}
