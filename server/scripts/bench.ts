import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { performance } from 'node:perf_hooks';
import { parseCase } from '../../shared/schemas/case.js';
import { screenCase } from '../../shared/screening/index.js';
import { parseSweepCsv } from '../../shared/imports/sweep-csv.js';

// npm run bench — speed of the pure engine on the example cases, of the sweep parser and of the demo seed into a fresh
// database; `-- --db` adds API timings on a throw-away MariaDB with a 5 000-unit fleet, and the largest allowed readings
// import with /api/health's latency during it (`-- --imports`: that alone, without the fleet). Figures go to the README.
// Timing belongs here, never in tests.

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');

function bench(name: string, fn: () => void, minMs = 1000): void {
  for (let i = 0; i < 20; i++) fn(); // warm up
  let n = 0;
  const t0 = performance.now();
  let t = t0;
  while (t - t0 < minMs) {
    fn();
    n++;
    if (n % 10 === 0) t = performance.now();
  }
  t = performance.now();
  const per = (t - t0) / n;
  console.log(`${name.padEnd(44)} ${n.toString().padStart(7)} runs  ${per.toFixed(3).padStart(9)} ms/run  ${(1000 / per).toFixed(0).padStart(8)} /s`);
}

// `-- --imports` alone: only the import figures (the engine's are left out).
const importsOnly = process.argv.includes('--imports') && !process.argv.includes('--db');
const casesDir = path.join(root, 'examples', 'cases');
for (const file of importsOnly ? [] : readdirSync(casesDir).filter((f) => f.endsWith('.json') && !f.endsWith('.result.json')).sort()) {
  const parsed = parseCase(JSON.parse(readFileSync(path.join(casesDir, file), 'utf8')));
  if (!parsed.ok) throw new Error(`${file} is not a valid case`);
  bench(`screenCase ${file}`, () => screenCase(parsed.value));
}

// A dense sweep: 20 000 points (the upload limit), both traces, through the whole engine.
const dense: [number, number][] = [];
for (let i = 0; i < 20000; i++) {
  const f = 20 * Math.pow(10, (i * 5) / 19999);
  dense.push([f, -40 - 20 * Math.sin(Math.log10(f) * 3)]);
}
const denseCase = parseCase({
  format: 'gapsight-case/1',
  unit: { serial: 'BENCH', phases: 3, ratedKVA: 40000, hvKV: 132, lvKV: 33, impedancePercent: 10.5 },
  sweeps: [{ label: 'HV-A-open', testType: 'open-circuit', baseline: dense, postFault: dense.map(([f, m]) => [f * 1.001, m + 0.1]) }],
});
if (!denseCase.ok) throw new Error('bench case invalid');
if (!importsOnly) bench('screenCase, one 20 000-point sweep pair', () => screenCase(denseCase.value));

const csv = ['frequencyHz,magnitudeDb,phaseDeg', ...dense.map(([f, m]) => `${f},${m},0`)].join('\n');
bench('parseSweepCsv, 20 000 rows', () => parseSweepCsv(csv));
// The demo seed needs a throw-away MariaDB (installed when missing, as by `npm start`); `-- --no-db` skips it.
if (!process.argv.includes('--no-db')) {
  const { benchDatabase } = await import('./bench-db.js');
  await benchDatabase({ fleet: process.argv.includes('--db'), imports: process.argv.includes('--imports') });
}
console.log(`\nNode ${process.version}, ${process.platform}/${process.arch}`);
