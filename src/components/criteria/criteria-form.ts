// The draft editor's model: every leaf of a criteria set as the text of an input, and back. No Vue here.
import type { Criteria } from '../../../shared/screening/criteria';
import { CRITERIA_SECTION_LABELS, criteriaLeaves, type CriteriaLeaf } from '../../../shared/screening/criteria-diff';

export const LEVEL_VALUES = ['ok', 'watch', 'investigate', 'critical'] as const;

export interface FormSection {
  key: string;
  label: string;
  leaves: (CriteriaLeaf & { field: string; isSource: boolean; isLevel: boolean })[];
}

/** The leaves an editor shows (not the version, which the server sets, nor the name, which has its own input), by section. */
export function formSections(c: Criteria): FormSection[] {
  const sections = new Map<string, FormSection>();
  for (const leaf of criteriaLeaves(c)) {
    if (leaf.section === 'version' || leaf.section === 'name') continue;
    const last = leaf.segments[leaf.segments.length - 1];
    const isSource = typeof last === 'string' && /source$/i.test(last);
    const isLevel = !isSource && typeof leaf.value === 'string' && (LEVEL_VALUES as readonly string[]).includes(leaf.value);
    const section = CRITERIA_SECTION_LABELS[leaf.section] ?? leaf.section;
    const field = leaf.label.split(' › ').slice(1).join(' › ') || section;
    let s = sections.get(leaf.section);
    if (!s) sections.set(leaf.section, (s = { key: leaf.section, label: section, leaves: [] }));
    s.leaves.push({ ...leaf, field: field.charAt(0).toUpperCase() + field.slice(1), isSource, isLevel });
  }
  return [...sections.values()];
}

/** The text an input starts with. */
export function leafText(v: unknown): string {
  if (v === null || v === undefined) return '';
  if (typeof v === 'boolean') return v ? 'yes' : 'no';
  return String(v);
}

/** An input's text as the leaf's value: numbers stay numbers (empty → null where the set allowed none); text that is
 *  not a number where a number was stays text, so the server names the field. */
export function leafValue(text: string, original: unknown): unknown {
  if (typeof original === 'number' || original === null) {
    const t = text.trim().replace(',', '.');
    if (t === '') return null;
    const n = Number(t);
    return Number.isFinite(n) ? n : text;
  }
  if (typeof original === 'boolean') return text === 'yes';
  return text;
}

/** The set with each leaf replaced by its input's value. */
export function thresholdsFromTexts(original: Criteria, texts: Record<string, string>): Criteria {
  // A JSON copy: the set may be a reactive proxy, which structuredClone refuses.
  const copy = JSON.parse(JSON.stringify(original)) as Record<string | number, unknown>;
  for (const leaf of criteriaLeaves(original)) {
    if (!(leaf.path in texts)) continue;
    let at = copy as Record<string | number, unknown>;
    for (const s of leaf.segments.slice(0, -1)) at = at[s] as Record<string | number, unknown>;
    at[leaf.segments[leaf.segments.length - 1]] = leafValue(texts[leaf.path], leaf.value);
  }
  return copy as unknown as Criteria;
}
