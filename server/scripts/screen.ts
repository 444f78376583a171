// CLI: screen one case file — `npm run --silent screen -- case.json [--pretty]`; result JSON on stdout, exit 2 on bad input.
import { readFileSync } from 'node:fs';
import { parseCase } from '../../shared/schemas/case.js';
import type { GapsightResult } from '../../shared/schemas/result.js';
import { screenCase } from '../../shared/screening/index.js';
import { reasonInWords } from '../../shared/screening/headline.js';
import { lacksBaselineTrace } from '../../shared/screening/verdict.js';
import { codesInWords, indicatorLabel, indicatorUnit, LEVEL_WORD, RECOMMENDATION_WORD } from '../../shared/vocabulary.js';
import { itemWords } from '../reports/report-text.js';
import { throughFaultInWords } from '../reports/screening-report.js';

const USAGE = 'usage: npm run --silent screen -- <case.json> [--pretty]';

/** Human-readable rendering of a result for `--pretty`: words, as the PDF and the screen say them (the JSON follows). */
function pretty(result: GapsightResult): string {
  const lines: string[] = [];
  lines.push(`Recommendation: ${RECOMMENDATION_WORD[result.recommendation]}${result.overallLevel ? ` (overall level ${LEVEL_WORD[result.overallLevel]})` : ''}`);
  lines.push('', 'Reasons:', ...result.reasons.map((r) => `  - ${codesInWords(reasonInWords(r))}`));
  // A sweep without a baseline trace to compare with is not missing: it is not judged (as the screen says).
  const missing = result.missing.filter((m) => !lacksBaselineTrace(m));
  const notJudged = result.missing.filter(lacksBaselineTrace);
  if (missing.length || notJudged.length) lines.push('');
  if (missing.length) lines.push(`Missing: ${missing.map(itemWords).join(', ')}`);
  if (notJudged.length) lines.push(`Not judged: ${notJudged.map(itemWords).join(', ')}`);
  if (result.unreliable.length) lines.push(`Unreliable: ${result.unreliable.map(itemWords).join(', ')}`);
  if (result.throughFault) {
    lines.push('', 'Through-fault:');
    for (const f of throughFaultInWords(result.throughFault)) lines.push(`  ${f.label}: ${f.value}${f.unit ? ` ${f.unit}` : ''}`);
  }
  lines.push('', 'Indicators:');
  for (const i of result.indicators) {
    const v = typeof i.value === 'number' ? Number(i.value.toPrecision(6)).toString() : String(i.value);
    const unit = typeof i.value === 'number' && indicatorUnit(i.key) ? ` ${indicatorUnit(i.key)}` : '';
    lines.push(`  ${LEVEL_WORD[i.level].padEnd(11)} ${indicatorLabel(i.key)}: ${v}${unit}${i.note ? `  (${i.note})` : ''}`);
  }
  lines.push('', 'Follow-ups:', ...result.followUps.map((f) => `  - ${codesInWords(f)}`));
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
