/**
 * Which bundled font stands in for a CSS font-family list, and where its file
 * is.
 *
 * plumbline measures text with the DejaVu fonts of the npm package
 * `dejavu-fonts-ttf`, so every machine gets the same numbers. A family list
 * resolves to one of three bundled families (sans, serif, mono) in one of
 * four faces (regular, bold, slanted, bold slanted). When the list asks first
 * for a family that is not bundled (Arial, Times, ...), the bundled family of
 * the same class is used and the result says `substituted: true`: its
 * measurements are then an approximation of what the author's machine drew.
 */
import { createRequire } from 'node:module';
import path from 'node:path';
import { FontFileError, parseFontFile, type OtFont } from './opentype-font.js';

/** The three classes every family list resolves to. */
export type GenericClass = 'sans-serif' | 'serif' | 'monospace';

export type FontStyle = 'normal' | 'italic' | 'oblique';

export type FaceId =
  | 'DejaVuSans'
  | 'DejaVuSans-Bold'
  | 'DejaVuSans-Oblique'
  | 'DejaVuSans-BoldOblique'
  | 'DejaVuSerif'
  | 'DejaVuSerif-Bold'
  | 'DejaVuSerif-Italic'
  | 'DejaVuSerif-BoldItalic'
  | 'DejaVuSansMono'
  | 'DejaVuSansMono-Bold'
  | 'DejaVuSansMono-Oblique'
  | 'DejaVuSansMono-BoldOblique';

/** One bundled face. */
export interface FontFace {
  readonly id: FaceId;
  /** File name inside the package's `ttf/` folder. */
  readonly file: string;
  /** Family name as the font declares it. */
  readonly family: string;
  readonly generic: GenericClass;
  readonly bold: boolean;
  /** True for the italic / oblique faces. */
  readonly slanted: boolean;
}

function face(id: FaceId, family: string, generic: GenericClass, bold: boolean, slanted: boolean): FontFace {
  return Object.freeze({ id, file: `${id}.ttf`, family, generic, bold, slanted });
}

/** Every face plumbline measures with. */
export const FONT_FACES: readonly FontFace[] = Object.freeze([
  face('DejaVuSans', 'DejaVu Sans', 'sans-serif', false, false),
  face('DejaVuSans-Bold', 'DejaVu Sans', 'sans-serif', true, false),
  face('DejaVuSans-Oblique', 'DejaVu Sans', 'sans-serif', false, true),
  face('DejaVuSans-BoldOblique', 'DejaVu Sans', 'sans-serif', true, true),
  face('DejaVuSerif', 'DejaVu Serif', 'serif', false, false),
  face('DejaVuSerif-Bold', 'DejaVu Serif', 'serif', true, false),
  face('DejaVuSerif-Italic', 'DejaVu Serif', 'serif', false, true),
  face('DejaVuSerif-BoldItalic', 'DejaVu Serif', 'serif', true, true),
  face('DejaVuSansMono', 'DejaVu Sans Mono', 'monospace', false, false),
  face('DejaVuSansMono-Bold', 'DejaVu Sans Mono', 'monospace', true, false),
  face('DejaVuSansMono-Oblique', 'DejaVu Sans Mono', 'monospace', false, true),
  face('DejaVuSansMono-BoldOblique', 'DejaVu Sans Mono', 'monospace', true, true),
]);

const FACE_BY_ID = new Map<FaceId, FontFace>(FONT_FACES.map((f) => [f.id, f]));

/** The face with this id. */
export function fontFace(id: FaceId): FontFace {
  const f = FACE_BY_ID.get(id);
  if (f === undefined) throw new FontFileError(`Unknown font face "${String(id)}"`);
  return f;
}

/** Weights from this value up use the bold face. */
export const BOLD_THRESHOLD = 600;

/** The face of a generic class for a weight and style. */
export function faceFor(generic: GenericClass, weight: number, style: FontStyle): FontFace {
  const bold = weight >= BOLD_THRESHOLD;
  const slanted = style !== 'normal';
  const found = FONT_FACES.find((f) => f.generic === generic && f.bold === bold && f.slanted === slanted);
  // Every (class, bold, slanted) combination is in the table.
  return found!;
}

// ---------------------------------------------------------------------------
// Family lists

/**
 * Bundled families, and families with the same glyph metrics: DejaVu grew
 * out of Bitstream Vera and kept Vera's Latin glyphs and advances.
 */
// from memory: DejaVu README ("based on the Bitstream Vera Fonts")
const BUNDLED: Readonly<Record<string, GenericClass>> = {
  'dejavu sans': 'sans-serif',
  'dejavu serif': 'serif',
  'dejavu sans mono': 'monospace',
  'bitstream vera sans': 'sans-serif',
  'bitstream vera serif': 'serif',
  'bitstream vera sans mono': 'monospace',
};

/** The CSS generic keywords this module resolves without calling it a substitution. */
const EXACT_GENERICS: Readonly<Record<string, GenericClass>> = {
  'sans-serif': 'sans-serif',
  serif: 'serif',
  monospace: 'monospace',
};

/** Other generic keywords: resolved, but what they stand for differs by system. */
const LOOSE_GENERICS: Readonly<Record<string, GenericClass>> = {
  'system-ui': 'sans-serif',
  'ui-sans-serif': 'sans-serif',
  'ui-serif': 'serif',
  'ui-monospace': 'monospace',
  'ui-rounded': 'sans-serif',
  cursive: 'sans-serif',
  fantasy: 'sans-serif',
  math: 'serif',
  emoji: 'sans-serif',
  fangsong: 'serif',
  '-apple-system': 'sans-serif',
  blinkmacsystemfont: 'sans-serif',
};

/** Widely installed families that are not bundled, by class. */
// common practice, no source: the usual fallback lists of chart libraries and CSS stacks
const KNOWN_FAMILIES: Readonly<Record<string, GenericClass>> = (() => {
  const table: Record<string, GenericClass> = {};
  const add = (generic: GenericClass, names: string[]): void => {
    for (const n of names) table[n] = generic;
  };
  add('sans-serif', [
    'arial', 'helvetica', 'helvetica neue', 'liberation sans', 'nimbus sans', 'nimbus sans l',
    'arimo', 'verdana', 'tahoma', 'segoe ui', 'roboto', 'open sans', 'noto sans', 'source sans pro',
    'source sans 3', 'lucida grande', 'lucida sans', 'lucida sans unicode', 'geneva', 'calibri',
    'trebuchet ms', 'gill sans', 'ubuntu', 'cantarell', 'fira sans', 'inter', 'pt sans', 'lato',
    'sf pro text', 'sf pro display', 'avenir', 'futura', 'franklin gothic medium', 'microsoft sans serif',
    'arial unicode ms', 'computer modern sans serif', 'cmu sans serif', 'stixgeneral', 'freesans',
  ]);
  add('serif', [
    'times', 'times new roman', 'liberation serif', 'nimbus roman', 'nimbus roman no9 l', 'tinos',
    'georgia', 'garamond', 'palatino', 'palatino linotype', 'book antiqua', 'cambria', 'noto serif',
    'source serif pro', 'source serif 4', 'computer modern', 'computer modern roman', 'cmu serif',
    'pt serif', 'bitstream charter', 'charter', 'century schoolbook', 'new century schoolbook',
    'baskerville', 'freeserif', 'stix', 'stix two text', 'utopia',
  ]);
  add('monospace', [
    'courier', 'courier new', 'liberation mono', 'nimbus mono', 'nimbus mono l', 'nimbus mono ps',
    'cousine', 'consolas', 'menlo', 'monaco', 'lucida console', 'source code pro', 'fira mono',
    'fira code', 'ubuntu mono', 'noto mono', 'noto sans mono', 'andale mono', 'sf mono', 'roboto mono',
    'jetbrains mono', 'cascadia code', 'cascadia mono', 'inconsolata', 'freemono', 'computer modern typewriter',
  ]);
  return table;
})();

/** A guess for a family nobody listed, from words in its name. */
function classFromName(name: string): GenericClass {
  if (/mono|code|courier|consol|typewriter|terminal/.test(name)) return 'monospace';
  if (/sans|grotesk|gothic/.test(name)) return 'sans-serif';
  if (/serif|roman|times|garamond|antiqua|book|caslon|bodoni|didot/.test(name)) return 'serif';
  return 'sans-serif';
}

/** Result of matching a family list. */
export interface FaceMatch {
  face: FontFace;
  generic: GenericClass;
  /**
   * True when the list asks first for a family that is not bundled, so the
   * bundled face only approximates the intended one.
   */
  substituted: boolean;
  /** The list entry that decided the class (lower case), or null for an empty list. */
  decidedBy: string | null;
}

/** Normalises one family name: unquoted, single-spaced, lower case. */
export function normaliseFamilyName(name: string): string {
  let s = name.trim();
  if (s.length >= 2 && (s[0] === '"' || s[0] === "'") && s[s.length - 1] === s[0]) s = s.slice(1, -1);
  return s.replace(/\s+/g, ' ').trim().toLowerCase();
}

/**
 * Splits a CSS `font-family` value into family names, unquoted and with
 * their case kept. Commas inside quotes do not split; an unbalanced quote
 * runs to the end of the value. Empty entries are dropped.
 */
export function parseFontFamilyList(css: string): string[] {
  const out: string[] = [];
  let current = '';
  let quote = '';
  for (const ch of css) {
    if (quote !== '') {
      if (ch === quote) quote = '';
      else current += ch;
    } else if (ch === '"' || ch === "'") {
      quote = ch;
    } else if (ch === ',') {
      out.push(current);
      current = '';
    } else {
      current += ch;
    }
  }
  out.push(current);
  return out.map((s) => s.replace(/\s+/g, ' ').trim()).filter((s) => s.length > 0);
}

/**
 * CSS `font-weight` as a number: keywords `normal` (400) and `bold` (700);
 * `bolder` / `lighter` relative to a normal parent (700 / 100); numbers in
 * 1..1000. Anything else is null.
 */
// source: CSS Fonts Module Level 4, §2.2 (font-weight) and its relative-weight table
export function parseFontWeight(value: string | number): number | null {
  if (typeof value === 'number') return Number.isFinite(value) && value >= 1 && value <= 1000 ? value : null;
  const v = value.trim().toLowerCase();
  if (v === 'normal') return 400;
  if (v === 'bold') return 700;
  if (v === 'bolder') return 700;
  if (v === 'lighter') return 100;
  if (!/^[+]?(\d+(\.\d*)?|\.\d+)$/.test(v)) return null;
  const n = Number(v);
  return n >= 1 && n <= 1000 ? n : null;
}

/** CSS `font-style` keyword (`oblique <angle>` counts as oblique); null when unknown. */
export function parseFontStyle(value: string): FontStyle | null {
  const v = value.trim().toLowerCase();
  if (v === 'normal') return 'normal';
  if (v === 'italic') return 'italic';
  if (v === 'oblique' || v.startsWith('oblique ')) return 'oblique';
  return null;
}

/**
 * The bundled face for a family list (as split by `parseFontFamilyList`, or
 * given one family per entry), a numeric weight and a style.
 *
 * Entries are tried in order. A bundled family wins at once; so does one of
 * the generic keywords `sans-serif`, `serif`, `monospace`; a widely known
 * family that is not bundled (Arial, Times, Courier, ...) or another generic
 * keyword (`system-ui`, ...) decides the class. `substituted` is false only
 * when the first entry is bundled or one of the three plain generic keywords.
 * A list of unknown names takes its class from the first name's words, else
 * sans-serif. An empty list means the renderer default: DejaVu Sans, as
 * plumbline's rasteriser uses, not counted as a substitution.
 */
export function matchFontFace(families: readonly string[], weight: number, style: FontStyle): FaceMatch {
  const w = Number.isFinite(weight) ? weight : 400;
  const names = families.map(normaliseFamilyName).filter((n) => n.length > 0);
  if (names.length === 0) {
    return { face: faceFor('sans-serif', w, style), generic: 'sans-serif', substituted: false, decidedBy: null };
  }
  for (let i = 0; i < names.length; i++) {
    const name = names[i]!;
    const exact = BUNDLED[name] ?? EXACT_GENERICS[name];
    if (exact !== undefined) {
      return { face: faceFor(exact, w, style), generic: exact, substituted: i > 0, decidedBy: name };
    }
    const known = KNOWN_FAMILIES[name] ?? LOOSE_GENERICS[name];
    if (known !== undefined) {
      return { face: faceFor(known, w, style), generic: known, substituted: true, decidedBy: name };
    }
  }
  const guess = classFromName(names[0]!);
  return { face: faceFor(guess, w, style), generic: guess, substituted: true, decidedBy: names[0]! };
}

// ---------------------------------------------------------------------------
// Files and loading

let fontDir: string | undefined;

/** Folder of the bundled `.ttf` files, found through node's module resolution. */
export function bundledFontFolder(): string {
  if (fontDir !== undefined) return fontDir;
  const require = createRequire(import.meta.url);
  let pkgJson: string;
  try {
    pkgJson = require.resolve('dejavu-fonts-ttf/package.json');
  } catch {
    throw new FontFileError('The npm package "dejavu-fonts-ttf" is not installed; plumbline measures text with it.');
  }
  fontDir = path.join(path.dirname(pkgJson), 'ttf');
  return fontDir;
}

/** Absolute path of a face's file. */
export function fontFilePath(f: FontFace): string {
  return path.join(bundledFontFolder(), f.file);
}

const loaded = new Map<FaceId, OtFont>();

/** The parsed font of a face, read on first use and kept for the process. */
export function loadFace(f: FontFace): OtFont {
  let font = loaded.get(f.id);
  if (font === undefined) {
    font = parseFontFile(fontFilePath(f));
    loaded.set(f.id, font);
  }
  return font;
}

export { FontFileError };
