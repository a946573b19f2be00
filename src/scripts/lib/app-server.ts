/** Starts the built app (dist/server/entry.mjs, through src/scripts/serve.mjs) as a child process and waits for it. */
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

export const ROOT = fileURLToPath(new URL('../../../', import.meta.url));
/** The built server; VARLEDGER_DIST (see astro.config.mjs) moves it for parallel local runs. */
export const ENTRY = `${ROOT}${(process.env.VARLEDGER_DIST ?? 'dist').replace(/^\.\//, '').replace(/\/$/, '')}/server/entry.mjs`;
/** Our launcher around the built handler (it fixes the client address; see serve.mjs). */
export const LAUNCHER = `${ROOT}src/scripts/serve.mjs`;

export type AppServer = { url: string; child: ChildProcess; stop: () => Promise<void> };

export async function startAppServer(env: Record<string, string>, opts: { quiet?: boolean; timeoutMs?: number } = {}): Promise<AppServer> {
  if (!existsSync(ENTRY)) throw new Error('The app is not built: run `npm run build` first (npm start and npm test do it for you).');
  const host = env.HOST ?? '127.0.0.1';
  const port = env.PORT ?? '4321';
  const child = spawn(process.execPath, [LAUNCHER], { cwd: ROOT, env: { ...process.env, ...env }, stdio: opts.quiet ? ['ignore', 'ignore', 'pipe'] : 'inherit' });
  let stderr = '';
  child.stderr?.on('data', (d) => (stderr = (stderr + d).slice(-4000)));
  const url = `http://${host}:${port}`;
  const deadline = Date.now() + (opts.timeoutMs ?? 30_000);
  for (;;) {
    if (child.exitCode !== null) throw new Error(`The app server exited with code ${child.exitCode}.\n${stderr}`);
    try {
      const res = await fetch(`${url}/api/health`);
      if (res.ok) break;
    } catch {
      /* not listening yet */
    }
    if (Date.now() > deadline) {
      child.kill('SIGKILL');
      throw new Error(`The app server did not answer on ${url} in time.\n${stderr}`);
    }
    await new Promise((r) => setTimeout(r, 150));
  }
  const stop = () =>
    new Promise<void>((resolve) => {
      if (child.exitCode !== null) return resolve();
      child.once('exit', () => resolve());
      child.kill('SIGTERM');
      setTimeout(() => child.kill('SIGKILL'), 5000).unref();
    });
  return { url, child, stop };
}
