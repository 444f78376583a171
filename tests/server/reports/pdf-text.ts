// What a PDF document definition prints, for the report tests: the text of every node (inline runs joined as printed,
// nodes one per line), and every run with the font it is printed in.
import type { Content, TDocumentDefinitions } from 'pdfmake/interfaces.js';

/** Keys whose strings are never printed (style names, colours, layout). */
const PRESENTATION_KEYS = new Set(['style', 'color', 'fillColor', 'alignment', 'lineColor', 'lineCap', 'type', 'widths', 'layout', 'font', 'decoration']);

/** The definition's content and, for a footer function, the footer of page 2 of 7. */
function printedParts(def: TDocumentDefinitions): unknown[] {
  const parts: unknown[] = [def.content];
  if (typeof def.footer === 'function') parts.push(def.footer(2, 7, { width: 595, height: 842, orientation: 'portrait' }) as Content);
  return parts;
}

/** The text of an inline `text` value: strings and nested runs joined as printed. */
function inline(v: unknown): string {
  if (typeof v === 'string') return v;
  if (typeof v === 'number') return String(v);
  if (Array.isArray(v)) return v.map(inline).join('');
  if (v && typeof v === 'object' && 'text' in v) return inline((v as { text: unknown }).text);
  return '';
}

/** Every printed text, one node a line (a table cell, a list item, a paragraph with its inline runs joined). */
export function pdfText(def: TDocumentDefinitions): string {
  const out: string[] = [];
  const walk = (v: unknown): void => {
    if (typeof v === 'string') out.push(v);
    else if (Array.isArray(v)) v.forEach(walk);
    else if (v && typeof v === 'object') {
      if ('text' in v) {
        out.push(inline((v as { text: unknown }).text));
        return;
      }
      for (const [k, x] of Object.entries(v)) if (!PRESENTATION_KEYS.has(k)) walk(x);
    }
  };
  printedParts(def).forEach(walk);
  return out.join('\n');
}

export interface PrintedRun {
  text: string;
  /** The font it is printed in: the node's own, else the nearest enclosing node's, else the default style's. */
  font: string;
}

/** Every printed run of text with its font. */
export function pdfRuns(def: TDocumentDefinitions): PrintedRun[] {
  const defaultFont = (def.defaultStyle as { font?: string } | undefined)?.font ?? 'Roboto';
  const out: PrintedRun[] = [];
  const walk = (v: unknown, font: string, inText: boolean): void => {
    if (typeof v === 'string') {
      if (v) out.push({ text: v, font });
    } else if (typeof v === 'number' && inText) out.push({ text: String(v), font });
    else if (Array.isArray(v)) v.forEach((x) => walk(x, font, inText));
    else if (v && typeof v === 'object') {
      const own = (v as { font?: unknown }).font;
      const f = typeof own === 'string' ? own : font;
      if ('text' in v) {
        walk((v as { text: unknown }).text, f, true);
        return;
      }
      for (const [k, x] of Object.entries(v)) if (!PRESENTATION_KEYS.has(k)) walk(x, f, false);
    }
  };
  printedParts(def).forEach((p) => walk(p, defaultFont, false));
  return out;
}
