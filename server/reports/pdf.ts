// Renders a pdfmake document definition to a PDF Buffer in Node with pdfmake 0.3's bundled Roboto and a symbol font for
// the arrows Roboto lacks (no network).
//
// pdfmake 0.3 in Node: `require('pdfmake')` is one shared instance (module.exports = new pdfmake()). Fonts are registered
// on it with addFonts({ Roboto: { normal: <path>, bold, italics, bolditalics } }) — the paths of the TTF files it ships in
// node_modules/pdfmake/fonts/Roboto — and createPdf(def).getBuffer() resolves to a Buffer. URL and local-file access
// policies are set too, so a document can load nothing but those font files.
import { createRequire } from 'node:module';
import path from 'node:path';
import pdfmake from 'pdfmake';
import type { TDocumentDefinitions } from 'pdfmake/interfaces.js';
import { PDF_SYMBOL_FONT } from './report-text.js';

const require = createRequire(import.meta.url);

type Faces = { normal: string; bold: string; italics: string; bolditalics: string };

/** The Roboto faces pdfmake ships (they have ≥ ≤ √ δ Ω, unlike the Roboto Condensed subsets; no arrows). */
export function bundledRobotoFonts(): { Roboto: Faces } {
  const dir = path.join(path.dirname(require.resolve('pdfmake/package.json')), 'fonts', 'Roboto');
  return {
    Roboto: {
      normal: path.join(dir, 'Roboto-Regular.ttf'),
      bold: path.join(dir, 'Roboto-Medium.ttf'),
      italics: path.join(dir, 'Roboto-Italic.ttf'),
      bolditalics: path.join(dir, 'Roboto-MediumItalic.ttf'),
    },
  };
}

/**
 * The font of the symbols Roboto lacks (→ ↑ ↓ ← ↔ ✓ ✕ ⚠; `PDF_SYMBOL_CHARACTERS`): Font Awesome Free Solid as
 * @quasar/extras ships it (fonts under the SIL OFL 1.1, see its LICENSE.txt), one face for every style.
 */
export function bundledSymbolFont(): Record<typeof PDF_SYMBOL_FONT, Faces> {
  const file = path.join(path.dirname(require.resolve('@quasar/extras/package.json')), 'exports', 'fontawesome-v7', 'fa-solid-900.woff2');
  return { [PDF_SYMBOL_FONT]: { normal: file, bold: file, italics: file, bolditalics: file } } as Record<typeof PDF_SYMBOL_FONT, Faces>;
}

/** Every font the PDF embeds, by the name the document definition uses. */
export function bundledPdfFonts(): Record<string, Faces> {
  return { ...bundledRobotoFonts(), ...bundledSymbolFont() };
}

let configured = false;

/** Registers the fonts and the access policies on pdfmake's shared instance, once per process. */
function setUp(): void {
  if (configured) return;
  const fonts = bundledPdfFonts();
  const allowed = new Set(Object.values(fonts).flatMap((faces) => Object.values(faces).map((p) => path.resolve(p))));
  pdfmake.addFonts(fonts);
  pdfmake.setUrlAccessPolicy(() => false);
  pdfmake.setLocalAccessPolicy((p: string) => allowed.has(path.resolve(p)));
  configured = true;
}

/** A copy of a definition's plain objects and arrays (functions kept), so pdfmake's in-place changes never reach the caller. */
function copyDefinition<T>(value: T): T {
  if (Array.isArray(value)) return value.map((v) => copyDefinition(v)) as T;
  if (value && typeof value === 'object' && Object.getPrototypeOf(value) === Object.prototype) {
    const out: Record<string, unknown> = {};
    for (const [k, v] of Object.entries(value)) out[k] = copyDefinition(v);
    return out as T;
  }
  return value;
}

/** Renders a document definition to a PDF (a Buffer starting with "%PDF-"). */
export async function renderPdf(def: TDocumentDefinitions): Promise<Buffer> {
  setUp();
  return pdfmake.createPdf(copyDefinition(def)).getBuffer();
}
