/**
 * Keeps rendering offline and inside the document.
 *
 * resvg-js 2.6.2 reads the file named by an `<image>` or `<feImage>` href when
 * that href is a plain path (absolute, or relative to the working directory)
 * and draws it; it has no option to turn this off. `http(s)://` hrefs are not
 * fetched by the renderer itself (it only lists them for the caller), and
 * style sheets (`@import`, `<?xml-stylesheet?>`) are never loaded. So before
 * any text reaches the renderer, every href that is neither an in-document
 * fragment (`#id`) nor a `data:` URL is replaced by an empty `data:` URL,
 * which the renderer cannot resolve to anything.
 *
 * Images embedded as `data:image/svg+xml` are rendered with a resolver that
 * loads no images at all, so nested documents cannot reach files either.
 *
 * resvg-js 2.6.2 aborts the whole process (a Rust panic, not a JS error) when
 * an `<feImage>` points at a `data:` URL that it treats as SVG (an
 * `image/svg+xml`, `text/plain` or typeless one) and that yields no drawing.
 * `<feImage>` hrefs are therefore limited to `#fragment`s and raster `data:`
 * URLs (PNG, JPEG, GIF, WebP); any other one is replaced as well.
 *
 * Documents that declare entities are refused: an entity's replacement text
 * could spell an href that this text-level pass cannot see.
 */

import { RasterInputError } from './errors.js';

/**
 * The value an external href is replaced with: an empty PNG `data:` URL, which
 * decodes to nothing (a typeless `data:,` would crash `<feImage>`, see above).
 */
export const NEUTRAL_HREF = 'data:image/png;base64,';

// Any attribute named `href` with or without a namespace prefix (`xlink:href`, `x:href`).
const HREF_ATTRIBUTE = /(\s(?:[A-Za-z_][\w.-]*:)?href\s*=\s*)(?:"([^"]*)"|'([^']*)')/gi;

// An <feImage> start tag (quote-aware: attribute values may contain '>').
const FE_IMAGE_TAG = /<(?:[A-Za-z_][\w.-]*:)?feImage\b(?:[^>"']|"[^"]*"|'[^']*')*>/g;

/** True when an `<feImage>` href is safe to hand to the renderer. */
export function isSafeFilterImageHref(raw: string): boolean {
  const v = raw.trimStart();
  return v.startsWith('#') || /^data:image\/(?:png|jpe?g|gif|webp)[;,]/i.test(v);
}

/** True when an href value (as written in the source) stays inside the document. */
export function isInternalHref(raw: string): boolean {
  const v = raw.trimStart();
  return v.startsWith('#') || /^data:/i.test(v);
}

export interface NeutralizeResult {
  text: string;
  /** How many hrefs were replaced. */
  replaced: number;
}

/**
 * Returns the text with every external href replaced by `NEUTRAL_HREF`.
 * Throws `RasterInputError` when the document declares entities.
 */
export function neutralizeExternalRefs(svgText: string): NeutralizeResult {
  if (/<!ENTITY/i.test(svgText)) {
    throw new RasterInputError(
      'The SVG declares XML entities (<!ENTITY ...>); such documents are not rendered.',
    );
  }
  let replaced = 0;
  const replaceHrefs = (text: string, keep: (value: string) => boolean): string =>
    text.replace(HREF_ATTRIBUTE, (whole, head: string, dq: string | undefined, sq: string | undefined) => {
      const value = dq ?? sq ?? '';
      if (keep(value)) return whole;
      replaced++;
      const q = dq !== undefined ? '"' : "'";
      return `${head}${q}${NEUTRAL_HREF}${q}`;
    });
  let text = svgText;
  if (text.includes('feImage')) {
    text = text.replace(FE_IMAGE_TAG, (tag) => replaceHrefs(tag, isSafeFilterImageHref));
  }
  text = replaceHrefs(text, isInternalHref);
  return { text, replaced };
}
