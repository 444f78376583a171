// CLI: screen one case file — `npm run --silent screen -- case.json [--pretty]`; result JSON on stdout, exit 2 on bad input.
import { readFileSync } from 'node:fs';
import { parseCase } from '../../shared/schemas/case.js';
import type { GapsightResult } from '../../shared/schemas/result.js';
import { screenCase } from '../../shared/screening/index.js';

const USAGE = 'usage: npm run --silent screen -- <case.json> [--pretty]';

/** Human-readable rendering of a result for `--pretty`. */
function pretty(result: GapsightResult): string {
  const lines: string[] = [];
  lines.push(`Recommendation: ${result.recommendation.toUpperCase()}${result.overallLevel ? ` (overall level ${result.overallLevel})` : ''}`);
  lines.push('', 'Reasons:', ...result.reasons.map((r) => `  - ${r}`));
  if (result.missing.length) lines.push('', `Missing: ${result.missing.join(', ')}`);
  if (result.unreliable.length) lines.push(`Unreliable: ${result.unreliable.join(', ')}`);
  if (result.throughFault) {
    lines.push('', 'Through-fault:');
    for (const [k, v] of Object.entries(result.throughFault)) lines.push(`  ${k.padEnd(22)} ${String(v)}`);
  }
  lines.push('', 'Indicators:');
  for (const i of result.indicators) {
    const v = typeof i.value === 'number' ? Number(i.value.toPrecision(6)).toString() : String(i.value);
    lines.push(`  ${i.level.padEnd(11)} ${i.key.padEnd(52)} ${v}${i.note ? `  (${i.note})` : ''}`);
  }
  lines.push('', 'Follow-ups:', ...result.followUps.map((f) => `  - ${f}`));
  lines.push('', 'Cautions:', ...result.cautions.map((c) => `  ${c}`));
  lines.push('', 'Result JSON:', JSON.stringify(result, null, 2));
  return lines.join('\n');
}

function main(argv: string[]): number {
  const prettyFlag = argv.includes('--pretty');
  const files = argv.filter((a) => a !== '--pretty' && a !== '--');
  if (files.length !== 1) {
    process.stderr.write(`${USAGE}\n`);
    return 2;
  }
  const path = files[0];
  let text: string;
  try {
    text = readFileSync(path, 'utf8');
  } catch (err) {
    process.stderr.write(`cannot read ${path}: ${(err as NodeJS.ErrnoException).code ?? (err as Error).message}\n`);
    return 2;
  }
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (err) {
    process.stderr.write(`${path} is not valid JSON: ${(err as Error).message}\n`);
    return 2;
  }
  const parsed = parseCase(json);
  if (!parsed.ok) {
    process.stderr.write(`${path} is not a valid gapsight-case/1 document:\n`);
    for (const e of parsed.errors) process.stderr.write(`  ${e.path}: ${e.message}\n`);
    return 2;
  }
  const result = screenCase(parsed.value);
  process.stdout.write(prettyFlag ? `${pretty(result)}\n` : `${JSON.stringify(result)}\n`);
  return 0;
}

process.exitCode = main(process.argv.slice(2));
