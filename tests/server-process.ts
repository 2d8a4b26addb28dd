import { spawn, type ChildProcess } from 'node:child_process';
import net from 'node:net';
import path from 'node:path';

export const root = path.resolve(__dirname, '..');

/** A port nobody listens on right now. */
export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = net.createServer();
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => {
      const { port } = server.address() as net.AddressInfo;
      server.close(() => resolve(port));
    });
  });
}

/** Polls `/api/health` until it answers 200; throws with the server's output if it exits or the time runs out. */
export async function waitForHealth(url: string, child: ChildProcess, log: () => string, timeoutMs: number, everyMs = 500) {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    if (child.exitCode !== null || child.signalCode !== null) {
      throw new Error(`The server exited (${child.exitCode ?? child.signalCode}):\n${log()}`);
    }
    try {
      const res = await fetch(`${url}/api/health`);
      if (res.ok) return;
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, everyMs));
  }
  throw new Error(`The server did not become healthy in ${timeoutMs} ms:\n${log()}`);
}

export type ServerProcess = {
  /** The origin the server calls itself (PUBLIC_URL's default), so sign-in accepts requests from it. */
  url: string;
  /** Milliseconds from spawning to the first healthy answer. */
  startMs: number;
  output: () => string;
  /** Sends `signal` to the server's process group (tsx and the node process it runs) and waits for it to end. */
  stop: (signal?: NodeJS.Signals) => Promise<void>;
};

/**
 * Starts the real server on `port`, with `env` added to this process's
 * environment, and waits until `/api/health` answers: the bundle
 * `npm run build` writes (`node dist-server/index.cjs`, as `npm run serve`
 * starts it) when `bundled`, otherwise the source through tsx.
 */
export async function startServer(port: number, env: Record<string, string>, { timeoutMs = 30_000, bundled = false } = {}): Promise<ServerProcess> {
  const url = `http://localhost:${port}`;
  let output = '';
  const started = performance.now();
  const [command, args] = bundled ? [process.execPath, ['dist-server/index.cjs']] : [path.join(root, 'node_modules', '.bin', 'tsx'), ['server/index.ts']];
  const child = spawn(command, args, {
    cwd: root,
    env: { ...process.env, ...env, PORT: String(port) },
    stdio: ['ignore', 'pipe', 'pipe'],
    detached: true,
  });
  child.stdout?.on('data', (d: Buffer) => (output += d.toString()));
  child.stderr?.on('data', (d: Buffer) => (output += d.toString()));
  const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
  const stop = async (signal: NodeJS.Signals = 'SIGTERM') => {
    if (child.pid && child.exitCode === null && child.signalCode === null) process.kill(-child.pid, signal);
    await exited;
  };
  try {
    await waitForHealth(url, child, () => output.slice(-4000), timeoutMs, 20);
  } catch (error) {
    await stop('SIGKILL');
    throw error;
  }
  return { url, startMs: performance.now() - started, output: () => output, stop };
}
