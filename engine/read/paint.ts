/**
 * Resolves fill and stroke values to Paint: plain colours, and paint servers
 * (gradients, patterns) referenced by url(#id) with a representative colour.
 */
import { converter } from 'culori';
import { parseColor as parseColorUncached } from '../color/parse-color.js';
import type { Rgba } from '../color/types.js';
import type { GradientStop, Paint } from './scene.js';
import type { XmlElement } from './xml-tree.js';

const toLab = converter('lab65');

// Charts repeat a handful of colour strings thousands of times: parse each once.
const colorCache = new Map<string, Rgba | null>();
export function parseColor(css: string): Rgba | null {
  let c = colorCache.get(css);
  if (c === undefined) {
    c = parseColorUncached(css);
    if (colorCache.size > 4096) colorCache.clear();
    colorCache.set(css, c);
  }
  return c ? { ...c } : null;
}
const toRgb = converter('rgb');

export const NO_PAINT: Paint = Object.freeze({ kind: 'none', color: null, opacity: 0, ref: null, stops: null }) as Paint;

/** Reads `url(#id) fallback` references; returns the id and the fallback text. */
export function parseUrlReference(value: string): { id: string; fallback: string } | null {
  const m = /^\s*url\(\s*(['"]?)#([^'")]+)\1\s*\)\s*(.*)$/.exec(value);
  return m ? { id: m[2]!, fallback: m[3]!.trim() } : null;
}

export interface PaintContext {
  byId: Map<string, XmlElement>;
  /** Resolved stop colours of an element (stop-color/stop-opacity after the cascade). */
  stopColor: (stop: XmlElement) => Rgba | null;
  currentColor: Rgba | null;
}

/** The colour mean of gradient stops, weighted by the offset interval each stop covers, in CIELAB. */
export function meanStopColor(stops: readonly GradientStop[]): Rgba | null {
  if (stops.length === 0) return null;
  if (stops.length === 1) return stops[0]!.color;
  let l = 0;
  let a = 0;
  let b = 0;
  let alpha = 0;
  let total = 0;
  for (let k = 0; k < stops.length - 1; k++) {
    const s0 = stops[k]!;
    const s1 = stops[k + 1]!;
    const w = Math.max(0, s1.offset - s0.offset);
    for (const s of [s0, s1]) {
      const lab = toLab({ mode: 'rgb', r: s.color.r, g: s.color.g, b: s.color.b });
      l += (w / 2) * lab.l;
      a += (w / 2) * lab.a;
      b += (w / 2) * lab.b;
      alpha += (w / 2) * s.color.alpha;
    }
    total += w;
  }
  if (total <= 0) return stops[stops.length - 1]!.color;
  const rgb = toRgb({ mode: 'lab65', l: l / total, a: a / total, b: b / total });
  const clamp = (v: number | undefined): number => Math.min(1, Math.max(0, v ?? 0));
  return { r: clamp(rgb.r), g: clamp(rgb.g), b: clamp(rgb.b), alpha: alpha / total };
}

/** Gradient stops, following `href` to the gradient that holds them (cycles and long chains stop). */
export function gradientStops(gradient: XmlElement, ctx: PaintContext): GradientStop[] {
  let el: XmlElement | undefined = gradient;
  const seen = new Set<XmlElement>();
  while (el && !seen.has(el) && seen.size < 16) {
    seen.add(el);
    const stops = el.children.filter((c): c is XmlElement => c.type === 'element' && c.name === 'stop');
    if (stops.length > 0) {
      let last = 0;
      const out: GradientStop[] = [];
      for (const s of stops) {
        const raw = s.attributes.offset ?? '0';
        let offset = raw.trim().endsWith('%') ? parseFloat(raw) / 100 : parseFloat(raw);
        if (!Number.isFinite(offset)) offset = 0;
        offset = Math.max(last, Math.min(1, Math.max(0, offset)));
        last = offset;
        const color = ctx.stopColor(s);
        if (color) out.push({ offset, color });
      }
      return out;
    }
    const href: string | undefined = el.attributes.href ?? el.attributes['xlink:href'];
    el = href?.startsWith('#') ? ctx.byId.get(href.slice(1)) : undefined;
  }
  return [];
}

/** Paint from a computed fill/stroke value and its opacity (already multiplied down the tree). */
export function resolvePaint(value: string | null | undefined, opacity: number, ctx: PaintContext): Paint {
  if (value == null) return NO_PAINT;
  const v = value.trim();
  if (v === '' || v === 'none') return NO_PAINT;
  const ref = parseUrlReference(v);
  if (ref) {
    const server = ctx.byId.get(ref.id);
    if (server && (server.name === 'linearGradient' || server.name === 'radialGradient')) {
      const stops = gradientStops(server, ctx);
      if (stops.length === 0) return NO_PAINT;
      const color = meanStopColor(stops);
      return { kind: 'gradient', color, opacity: opacity * (color?.alpha ?? 1), ref: ref.id, stops };
    }
    if (server && server.name === 'pattern') {
      return { kind: 'pattern', color: patternColor(server, ctx), opacity, ref: ref.id, stops: null };
    }
    // Unknown reference: SVG uses the fallback colour, or draws nothing.
    return ref.fallback ? resolvePaint(ref.fallback, opacity, ctx) : NO_PAINT;
  }
  const color = v === 'currentColor' || v === 'currentcolor' ? ctx.currentColor : parseColor(v);
  if (!color) return NO_PAINT;
  const eff = opacity * color.alpha;
  if (eff <= 0) return NO_PAINT;
  return { kind: 'color', color: { ...color, alpha: 1 }, opacity: eff, ref: null, stops: null };
}

/** A pattern's representative colour: the fill of its first filled child, when stated plainly. */
function patternColor(pattern: XmlElement, ctx: PaintContext): Rgba | null {
  for (const c of pattern.children) {
    if (c.type !== 'element') continue;
    const fill = c.attributes.fill;
    if (fill && fill !== 'none') {
      const parsed = parseColor(fill);
      if (parsed) return parsed;
    }
  }
  return ctx.currentColor;
}
