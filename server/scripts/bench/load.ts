import { createRequire } from 'node:module';

// Load runs with autocannon (its programmatic API). Latencies are collected from every response (autocannon's client
// 'response' event), so p50, p95 and p99 are exact percentiles of this run, not histogram buckets.

interface AutocannonResult {
  requests: { average: number; total: number };
  duration: number;
  non2xx: number;
  errors: number;
  timeouts: number;
}
type Client = { on(event: 'response', fn: (status: number, bytes: number, responseTime: number) => void): void };
type Autocannon = (opts: Record<string, unknown>) => Promise<AutocannonResult>;
const autocannon = createRequire(import.meta.url)('autocannon') as Autocannon;

export interface LoadFigure {
  url: string;
  connections: number;
  seconds: number;
  requests: number;
  rps: number;
  p50: number;
  p95: number;
  p99: number;
  errors: number;
  /** Answers by status code. */
  statuses: Record<string, number>;
}

function percentile(sorted: readonly number[], q: number): number {
  if (!sorted.length) return NaN;
  return sorted[Math.min(sorted.length - 1, Math.max(0, Math.ceil(q * sorted.length) - 1))];
}

/** `connections` clients asking GET `url` for `seconds`; fails when an answer is not 2xx or a request errs. */
export async function loadRun(url: string, connections: number, seconds: number, headers: Record<string, string> = {}): Promise<LoadFigure> {
  const latencies: number[] = [];
  const statuses: Record<string, number> = {};
  const result = await autocannon({
    url,
    connections,
    duration: seconds,
    headers,
    setupClient: (client: Client) => client.on('response', (status, _bytes, ms) => {
      latencies.push(ms);
      statuses[status] = (statuses[status] ?? 0) + 1;
    }),
  });
  const sorted = latencies.sort((a, b) => a - b);
  const figure: LoadFigure = {
    url,
    connections,
    seconds,
    requests: result.requests.total,
    rps: result.requests.total / (result.duration || seconds),
    p50: percentile(sorted, 0.5),
    p95: percentile(sorted, 0.95),
    p99: percentile(sorted, 0.99),
    errors: result.non2xx + result.errors + result.timeouts,
    statuses,
  };
  // A few failed answers are part of the figure (reported beside it); a run where most fail is no figure.
  if (figure.errors > figure.requests / 2) throw new Error(`${url} at ${connections} connections: ${result.non2xx} non-2xx answers, ${result.errors} errors, ${result.timeouts} timeouts`);
  return figure;
}

/** Keys of a value, one level down into the first element of arrays and into objects (a.b, items[].c): to compare two answers' shapes. */
export function shapeKeys(v: unknown, prefix = '', depth = 2): string[] {
  if (Array.isArray(v)) return v.length ? shapeKeys(v[0], `${prefix}[]`, depth) : [];
  if (v === null || typeof v !== 'object') return [];
  const out: string[] = [];
  for (const [k, x] of Object.entries(v as Record<string, unknown>)) {
    const key = prefix ? `${prefix}.${k}` : k;
    out.push(key);
    if (depth > 0) out.push(...shapeKeys(x, key, depth - 1));
  }
  return out;
}

/** What the app's answer has that the floor's lacks (and the other way), and the lengths of their top-level lists. */
export function compareShapes(app: unknown, floor: unknown): { missingInFloor: string[]; extraInFloor: string[]; counts: string } {
  const a = new Set(shapeKeys(app));
  const f = new Set(shapeKeys(floor));
  const lists = (v: unknown) =>
    Object.entries((v ?? {}) as Record<string, unknown>)
      .filter(([k, x]) => Array.isArray(x) && a.has(k))
      .map(([k, x]) => `${k} ${(x as unknown[]).length}`)
      .join(', ');
  const la = lists(app);
  const lf = lists(floor);
  return { missingInFloor: [...a].filter((k) => !f.has(k)), extraInFloor: [...f].filter((k) => !a.has(k)), counts: la === lf ? la : `app: ${la} / floor: ${lf}` };
}

/**
 * Runs in a child process (server/scripts/bench/load-child.ts, started once and kept), so that the load generator does
 * not share the event loop of the servers under test (the app and the floor both run in the bench's own process).
 */
export async function startLoadChild(root: string): Promise<{ run: (url: string, connections: number, seconds: number, headers?: Record<string, string>) => Promise<LoadFigure>; stop: () => void }> {
  const { spawn } = await import('node:child_process');
  const path = await import('node:path');
  const tsx = path.join(root, 'node_modules', 'tsx', 'dist', 'cli.mjs');
  const child = spawn(process.execPath, [tsx, '--tsconfig', path.join(root, 'server', 'tsconfig.json'), path.join(root, 'server', 'scripts', 'bench', 'load-child.ts')], {
    cwd: root,
    stdio: ['pipe', 'pipe', 'inherit'],
  });
  let buffer = '';
  let waiting: ((line: string) => void) | null = null;
  child.stdout.on('data', (d) => {
    buffer += d;
    let n;
    while ((n = buffer.indexOf('\n')) >= 0) {
      const line = buffer.slice(0, n);
      buffer = buffer.slice(n + 1);
      waiting?.(line);
    }
  });
  let exited = false;
  child.on('exit', () => {
    exited = true;
    waiting?.(JSON.stringify({ error: 'the load process ended' }));
  });
  return {
    run: (url, connections, seconds, headers = {}) =>
      new Promise((resolve, reject) => {
        if (exited) return reject(new Error('the load process ended'));
        waiting = (line) => {
          waiting = null;
          const answer = JSON.parse(line) as LoadFigure & { error?: string };
          if (answer.error) reject(new Error(`GET ${url} at ${connections} connections: ${answer.error}`));
          else resolve(answer);
        };
        child.stdin.write(`${JSON.stringify({ url, connections, seconds, headers })}\n`);
      }),
    stop: () => {
      child.stdin.end();
      if (!exited) child.kill();
    },
  };
}
