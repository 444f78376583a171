import { readFileSync, writeFileSync } from 'node:fs';

// The bench's one table (figure | value | floor | ratio | goal | holds?), as text, as JSON and as the README's table.

export interface Figure {
  /** Stable key (engine, load.units.10.rps, …). */
  id: string;
  figure: string;
  value: number;
  floor: number;
  /** value / floor. */
  ratio: number;
  unit: string;
  goal: string;
  /** null: no goal for this figure. */
  holds: boolean | null;
  /** What else the step measured (p50/p99, shapes compared, rows, …). */
  detail?: string;
}

export interface Machine { cpus: string; cpuCount: number; node: string; date: string; loadAverageAtStart: number[]; platform: string }

export interface BenchReport { mode: 'full' | 'quick'; machine: Machine; setup: Record<string, unknown>; figures: Figure[]; skipped: string[] }

export function figure(id: string, name: string, value: number, floor: number, unit: string, goal: string, holds: (ratio: number, value: number) => boolean | null, detail?: string): Figure {
  const ratio = value / floor;
  return { id, figure: name, value, floor, ratio, unit, goal, holds: holds(ratio, value), detail };
}

const num = (x: number, unit: string) => {
  if (!Number.isFinite(x)) return String(x);
  const digits = Math.abs(x) >= 100 ? 0 : Math.abs(x) >= 10 ? 1 : 2;
  return `${x.toFixed(digits)}${unit ? ` ${unit}` : ''}`;
};
const holdsText = (h: boolean | null) => (h === null ? '—' : h ? 'yes' : 'no');

export function rowsOf(figures: readonly Figure[]): string[][] {
  return figures.map((f) => [f.figure, num(f.value, f.unit), num(f.floor, f.unit), `${f.ratio.toFixed(2)} ×`, f.goal, holdsText(f.holds)]);
}

export const HEADER = ['figure', 'value', 'floor', 'ratio', 'goal', 'holds?'];

export function textTable(figures: readonly Figure[]): string {
  const rows = [HEADER, ...rowsOf(figures)];
  const w = HEADER.map((_, i) => Math.max(...rows.map((r) => r[i].length)));
  const line = (r: string[]) => r.map((c, i) => c.padEnd(w[i])).join(' | ');
  return [line(rows[0]), w.map((n) => '-'.repeat(n)).join('-|-'), ...rows.slice(1).map(line)].join('\n');
}

export function markdownTable(report: BenchReport): string {
  const m = report.machine;
  const esc = (s: string) => s.replace(/\|/g, '\\|');
  return [
    `Measured ${m.date} on ${m.cpuCount} × ${m.cpus}, Node ${m.node}, ${m.platform}, load average ${m.loadAverageAtStart.map((x) => x.toFixed(2)).join(' / ')} at the start (\`npm run bench\`, ${report.mode} run).`,
    '',
    `| ${HEADER.join(' | ')} |`,
    `|${HEADER.map(() => '---').join('|')}|`,
    ...rowsOf(report.figures).map((r) => `| ${r.map(esc).join(' | ')} |`),
    ...(report.skipped.length ? ['', ...report.skipped.map((s) => `Skipped: ${s}`)] : []),
  ].join('\n');
}

export const README_BEGIN = '<!-- bench:begin -->';
export const README_END = '<!-- bench:end -->';

/** Replaces the README's text between the bench markers with the table; false when the markers are missing. */
export function writeReadmeTable(readmePath: string, report: BenchReport): boolean {
  const text = readFileSync(readmePath, 'utf8');
  const a = text.indexOf(README_BEGIN);
  const b = text.indexOf(README_END);
  if (a < 0 || b < a) return false;
  writeFileSync(readmePath, `${text.slice(0, a + README_BEGIN.length)}\n${markdownTable(report)}\n${text.slice(b)}`);
  return true;
}

/** Problems that make a run fail: a figure that is not a positive finite number (value, floor or ratio). */
export function figureProblems(figures: readonly Figure[]): string[] {
  const bad = (x: number) => !(Number.isFinite(x) && x > 0);
  return figures.filter((f) => bad(f.value) || bad(f.floor) || bad(f.ratio)).map((f) => `${f.figure}: value ${f.value}, floor ${f.floor}, ratio ${f.ratio}`);
}
