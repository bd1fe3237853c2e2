/**
 * The TrueType fonts plumbline renders with. They come from the npm package
 * `dejavu-fonts-ttf`, so every machine draws text with the same outlines and
 * rendering never depends on what fonts a system happens to have.
 */
import { existsSync } from 'node:fs';
import { createRequire } from 'node:module';
import path from 'node:path';

/** One bundled font face. */
export interface BundledFace {
  /** File name inside the package's `ttf/` folder. */
  file: string;
  /** The family name the font declares in its name table. */
  family: string;
  weight: 'normal' | 'bold';
  style: 'normal' | 'oblique' | 'italic';
}

/** Faces loaded for every render: the sans, mono and serif families. */
export const BUNDLED_FACES: readonly BundledFace[] = Object.freeze([
  { file: 'DejaVuSans.ttf', family: 'DejaVu Sans', weight: 'normal', style: 'normal' },
  { file: 'DejaVuSans-Bold.ttf', family: 'DejaVu Sans', weight: 'bold', style: 'normal' },
  { file: 'DejaVuSans-Oblique.ttf', family: 'DejaVu Sans', weight: 'normal', style: 'oblique' },
  { file: 'DejaVuSans-BoldOblique.ttf', family: 'DejaVu Sans', weight: 'bold', style: 'oblique' },
  { file: 'DejaVuSansMono.ttf', family: 'DejaVu Sans Mono', weight: 'normal', style: 'normal' },
  { file: 'DejaVuSansMono-Bold.ttf', family: 'DejaVu Sans Mono', weight: 'bold', style: 'normal' },
  { file: 'DejaVuSerif.ttf', family: 'DejaVu Serif', weight: 'normal', style: 'normal' },
  { file: 'DejaVuSerif-Bold.ttf', family: 'DejaVu Serif', weight: 'bold', style: 'normal' },
]);

/** The family used when an SVG names no font, or only fonts that are not bundled. */
export const DEFAULT_FONT_FAMILY = 'DejaVu Sans';

/** CSS generic family keywords and the bundled family each one resolves to. */
export const GENERIC_FAMILY_MAP: Readonly<Record<'sans-serif' | 'serif' | 'monospace', string>> =
  Object.freeze({
    'sans-serif': 'DejaVu Sans',
    serif: 'DejaVu Serif',
    monospace: 'DejaVu Sans Mono',
  });

/** Thrown when the font package is missing or incomplete. */
export class BundledFontError extends Error {
  override readonly name = 'BundledFontError';
}

let cachedDir: string | undefined;

/** Absolute folder holding the bundled `.ttf` files, resolved through node's module resolution. */
export function bundledFontDir(): string {
  if (cachedDir !== undefined) return cachedDir;
  const require = createRequire(import.meta.url);
  let pkgJson: string;
  try {
    pkgJson = require.resolve('dejavu-fonts-ttf/package.json');
  } catch {
    throw new BundledFontError(
      'The npm package "dejavu-fonts-ttf" is not installed; plumbline needs it to draw text.',
    );
  }
  cachedDir = path.join(path.dirname(pkgJson), 'ttf');
  return cachedDir;
}

let cachedFiles: string[] | undefined;

/** Absolute paths of the bundled font files, in the order of `BUNDLED_FACES`. */
export function bundledFontFiles(): string[] {
  if (cachedFiles !== undefined) return [...cachedFiles];
  const dir = bundledFontDir();
  const files = BUNDLED_FACES.map((face) => path.join(dir, face.file));
  const missing = files.filter((f) => !existsSync(f));
  if (missing.length > 0) {
    throw new BundledFontError(
      `Font files missing from "dejavu-fonts-ttf": ${missing.map((f) => path.basename(f)).join(', ')}`,
    );
  }
  cachedFiles = files;
  return [...files];
}

const GENERIC_KEYS = Object.keys(GENERIC_FAMILY_MAP) as (keyof typeof GENERIC_FAMILY_MAP)[];

/** Replaces bare generic keywords in one comma-separated family list; other entries are kept verbatim. */
export function mapFamilyList(list: string): string {
  const parts = splitFamilyList(list);
  if (parts === null) return list;
  let changed = false;
  const out = parts.map((part) => {
    const bare = part.trim().toLowerCase();
    const key = GENERIC_KEYS.find((k) => k === bare);
    if (key === undefined) return part;
    changed = true;
    const lead = part.match(/^\s*/)?.[0] ?? '';
    const trail = part.match(/\s*$/)?.[0] ?? '';
    return `${lead}${GENERIC_FAMILY_MAP[key]}${trail}`;
  });
  return changed ? out.join(',') : list;
}

/** Splits on commas outside quotes; null when quotes are unbalanced (the list is then left alone). */
function splitFamilyList(list: string): string[] | null {
  const parts: string[] = [];
  let quote = '';
  let start = 0;
  for (let i = 0; i < list.length; i++) {
    const ch = list[i];
    if (quote !== '') {
      if (ch === quote) quote = '';
    } else if (ch === '"' || ch === "'") {
      quote = ch;
    } else if (ch === ',') {
      parts.push(list.slice(start, i));
      start = i + 1;
    }
  }
  if (quote !== '') return null;
  parts.push(list.slice(start));
  return parts;
}

// `font-family="..."` / `font-family='...'` attributes.
const FAMILY_ATTRIBUTE = /(\sfont-family\s*=\s*)(?:"([^"]*)"|'([^']*)')/g;
// `style="..."` attributes, whose value is a CSS declaration list.
const STYLE_ATTRIBUTE = /(\sstyle\s*=\s*)(?:"([^"]*)"|'([^']*)')/g;
// `<style>` elements (a CDATA section inside is just more text here).
const STYLE_ELEMENT = /(<(?:[A-Za-z_][\w.-]*:)?style\b(?:[^>"']|"[^"]*"|'[^']*')*>)([\s\S]*?)(<\/(?:[A-Za-z_][\w.-]*:)?style\s*>)/g;
// `font-family: ...` inside CSS text; the value ends at `;`, `}` or `!important`.
const FAMILY_DECLARATION = /(font-family\s*:\s*)((?:"[^"]*"|'[^']*'|[^;}"'!])*)/gi;

function mapDeclarations(css: string): string {
  return css.replace(FAMILY_DECLARATION, (whole, head: string, value: string) => {
    const mapped = mapFamilyList(value);
    return mapped === value ? whole : `${head}${mapped}`;
  });
}

/**
 * Rewrites the CSS generic keywords `sans-serif`, `serif` and `monospace` in
 * `font-family` attributes, `style` attributes and `<style>` sheets to the
 * bundled family they stand for.
 *
 * resvg-js 2.6.2 resolves every generic keyword to its one default family and
 * ignores its per-keyword family options, so without this rewrite `serif` and
 * `monospace` text would be drawn in the sans face. Only bare keywords are
 * replaced; the replacement names contain no quotes, so the surrounding
 * attribute or rule keeps its quoting. Named families that are not bundled
 * (Arial, Helvetica, ...) are left as written and fall back to the default.
 */
export function substituteGenericFamilies(svgText: string): string {
  if (!/font-family/i.test(svgText)) return svgText;
  const quoted = (head: string, dq: string | undefined, sq: string | undefined, map: (v: string) => string, whole: string) => {
    const value = dq ?? sq ?? '';
    const mapped = map(value);
    if (mapped === value) return whole;
    const q = dq !== undefined ? '"' : "'";
    return `${head}${q}${mapped}${q}`;
  };
  return svgText
    .replace(FAMILY_ATTRIBUTE, (whole, head: string, dq?: string, sq?: string) => quoted(head, dq, sq, mapFamilyList, whole))
    .replace(STYLE_ATTRIBUTE, (whole, head: string, dq?: string, sq?: string) => quoted(head, dq, sq, mapDeclarations, whole))
    .replace(STYLE_ELEMENT, (whole, open: string, css: string, close: string) => {
      const mapped = mapDeclarations(css);
      return mapped === css ? whole : `${open}${mapped}${close}`;
    });
}
