// What a PDF document definition prints, for the report tests: the text of every node (inline runs joined as printed,
// nodes one per line), every run with the font it is printed in, and the text a rendered PDF draws.
import { inflateSync } from 'node:zlib';
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

/** The texts of an SVG string's <text> elements (entities decoded), one per element. */
function svgTexts(svg: string): string[] {
  const decode = (t: string) => t.replace(/&lt;/g, '<').replace(/&gt;/g, '>').replace(/&quot;/g, '"').replace(/&apos;/g, "'").replace(/&amp;/g, '&');
  return [...svg.matchAll(/<text\b[^>]*>([\s\S]*?)<\/text>/g)].map((m) => decode(m[1].replace(/<[^>]+>/g, '')));
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
      for (const [k, x] of Object.entries(v)) {
        // An `svg` drawing prints the texts of its <text> elements, not its markup.
        if (k === 'svg' && typeof x === 'string') out.push(...svgTexts(x));
        else if (!PRESENTATION_KEYS.has(k)) walk(x);
      }
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

// ---------------------------------------------------------------------------------------------------------------------
// The text of a rendered PDF, decoded in-process (pdfkit's output: Type0 fonts, Identity-H, a ToUnicode map per font,
// Flate-compressed streams), so a test can read what was drawn without an external tool.

interface PdfObject {
  dict: string;
  stream?: Buffer;
}

function pdfObjects(pdf: Buffer): Map<number, PdfObject> {
  const s = pdf.toString('latin1');
  const out = new Map<number, PdfObject>();
  const head = /(\d+) 0 obj\s*/g;
  let m: RegExpExecArray | null;
  while ((m = head.exec(s))) {
    const start = m.index + m[0].length;
    const end = s.indexOf('endobj', start);
    const body = s.slice(start, end);
    const at = body.search(/>>\s*stream\r?\n/);
    if (at < 0) {
      out.set(Number(m[1]), { dict: body });
    } else {
      const dict = body.slice(0, at + 2);
      const dataStart = start + body.indexOf('stream', at) + 'stream'.length + (s[start + body.indexOf('stream', at) + 6] === '\r' ? 2 : 1);
      const dataEnd = s.lastIndexOf('endstream', end);
      let data = pdf.subarray(dataStart, dataEnd);
      if (data[data.length - 1] === 0x0a) data = data.subarray(0, data.length - 1);
      out.set(Number(m[1]), { dict, stream: /\/FlateDecode/.test(dict) ? inflateSync(data) : data });
    }
    head.lastIndex = end;
  }
  return out;
}

/** Code → text of a ToUnicode CMap (bfchar and bfrange, both forms). */
function toUnicodeMap(cmap: string): Map<number, string> {
  const map = new Map<number, string>();
  const hexText = (h: string) => String.fromCodePoint(...(h.match(/.{4}/g) ?? []).map((x) => parseInt(x, 16)));
  for (const block of cmap.matchAll(/beginbfchar([\s\S]*?)endbfchar/g)) {
    for (const [, src, dst] of block[1].matchAll(/<([0-9a-fA-F]+)>\s*<([0-9a-fA-F]+)>/g)) map.set(parseInt(src, 16), hexText(dst));
  }
  for (const block of cmap.matchAll(/beginbfrange([\s\S]*?)endbfrange/g)) {
    for (const [, lo, hi, rest] of block[1].matchAll(/<([0-9a-fA-F]+)>\s*<([0-9a-fA-F]+)>\s*(\[[^\]]*\]|<[0-9a-fA-F]+>)/g)) {
      const a = parseInt(lo, 16);
      const b = parseInt(hi, 16);
      if (rest.startsWith('[')) {
        const list = [...rest.matchAll(/<([0-9a-fA-F]+)>/g)].map((x) => hexText(x[1]));
        for (let c = a; c <= b; c++) map.set(c, list[c - a] ?? '');
      } else {
        const first = parseInt(rest.slice(1, -1), 16);
        for (let c = a; c <= b; c++) map.set(c, String.fromCodePoint(first + c - a));
      }
    }
  }
  return map;
}

export interface RenderedRun {
  /** The font's base name without its subset tag ("Roboto-Regular", "FontAwesome7Free-Solid"). */
  font: string;
  text: string;
  /** How many glyphs were drawn as glyph 0 (.notdef: a character the font has no glyph for). */
  notdef: number;
}

/** Every text run drawn in a rendered PDF, decoded through the fonts' ToUnicode maps, in the order drawn. */
export function renderedRuns(pdf: Buffer): RenderedRun[] {
  const objects = pdfObjects(pdf);
  const fonts = new Map<number, { name: string; map: Map<number, string> }>();
  for (const [id, o] of objects) {
    if (!/\/Subtype \/Type0/.test(o.dict)) continue;
    const name = /\/BaseFont \/(?:[A-Z]{6}\+)?([^\s/>]+)/.exec(o.dict)?.[1] ?? '?';
    const tu = /\/ToUnicode (\d+) 0 R/.exec(o.dict);
    const cmap = tu ? objects.get(Number(tu[1]))?.stream?.toString('latin1') ?? '' : '';
    fonts.set(id, { name, map: toUnicodeMap(cmap) });
  }
  const resource = new Map<string, number>();
  for (const o of objects.values()) for (const [, name, id] of o.dict.matchAll(/\/(F\d+) (\d+) 0 R/g)) resource.set(name, Number(id));
  const runs: RenderedRun[] = [];
  for (const o of objects.values()) {
    const content = o.stream?.toString('latin1');
    if (!content || !/\bTf\b/.test(content) || !/\bBT\b/.test(content)) continue;
    let font: { name: string; map: Map<number, string> } | undefined;
    for (const t of content.matchAll(/\/(F\d+)\s+[-\d.]+\s+Tf|\[((?:[^\]])*)\]\s*TJ|<([0-9a-fA-F]*)>\s*Tj/g)) {
      if (t[1]) {
        font = fonts.get(resource.get(t[1]) ?? -1);
        continue;
      }
      const hex = t[2] !== undefined ? [...t[2].matchAll(/<([0-9a-fA-F]*)>/g)].map((x) => x[1]).join('') : t[3];
      const codes = (hex.match(/.{4}/g) ?? []).map((x) => parseInt(x, 16));
      runs.push({ font: font?.name ?? '?', text: codes.map((c) => font?.map.get(c) ?? '\uFFFD').join(''), notdef: codes.filter((c) => c === 0).length });
    }
  }
  return runs;
}
