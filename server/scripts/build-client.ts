import { spawnSync } from 'node:child_process';
import { existsSync, readdirSync, statSync } from 'node:fs';
import path from 'node:path';

// Builds the client with Vite when dist/ is missing or older than any client source.

function newestMtime(p: string): number {
  if (!existsSync(p)) return 0;
  const st = statSync(p);
  if (!st.isDirectory()) return st.mtimeMs;
  let max = st.mtimeMs;
  for (const e of readdirSync(p)) if (e !== 'node_modules') max = Math.max(max, newestMtime(path.join(p, e)));
  return max;
}

const CLIENT_INPUTS = ['src', 'shared', 'index.html', 'vite.config.ts', 'package.json', 'public'];

/** True when dist/index.html is missing or older than a client input. */
export function clientIsStale(root: string, outDir = 'dist'): boolean {
  const built = path.join(root, outDir, 'index.html');
  if (!existsSync(built)) return true;
  const builtAt = statSync(built).mtimeMs;
  return CLIENT_INPUTS.some((i) => newestMtime(path.join(root, i)) > builtAt);
}

/** Runs `vite build` (returns false on failure; the output has the reason). */
export function buildClient(root: string, outDir = 'dist', quiet = false): boolean {
  const vite = path.join(root, 'node_modules', 'vite', 'bin', 'vite.js');
  const r = spawnSync(process.execPath, [vite, 'build', '--outDir', outDir, '--emptyOutDir', ...(quiet ? ['--logLevel', 'warn'] : [])], {
    cwd: root,
    stdio: 'inherit',
  });
  return r.status === 0;
}
