import { existsSync, readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import {
  NEUTRAL_HREF,
  isInternalHref,
  isSafeFilterImageHref,
  neutralizeExternalRefs,
} from '../engine/raster/external-refs.js';
import {
  BUNDLED_FACES,
  GENERIC_FAMILY_MAP,
  bundledFontFiles,
  mapFamilyList,
  substituteGenericFamilies,
} from '../engine/raster/fonts.js';

describe('bundled fonts', () => {
  it('are TrueType files inside the installed package', () => {
    const files = bundledFontFiles();
    expect(files.length).toBe(BUNDLED_FACES.length);
    for (const f of files) {
      expect(existsSync(f)).toBe(true);
      expect(f).toMatch(/dejavu-fonts-ttf[\\/]ttf[\\/]DejaVu[\w-]+\.ttf$/);
      // source: OpenType spec, table directory — sfntVersion 0x00010000 for TrueType outlines
      expect(readFileSync(f).readUInt32BE(0)).toBe(0x00010000);
    }
  });

  it('map each CSS generic family to a bundled family', () => {
    // source: CSS Fonts Level 4, §2.1.3 generic font families (sans-serif, serif, monospace)
    const families = new Set(BUNDLED_FACES.map((f) => f.family));
    for (const family of Object.values(GENERIC_FAMILY_MAP)) expect(families.has(family)).toBe(true);
  });
});

describe('substituteGenericFamilies', () => {
  it('replaces bare generic keywords only', () => {
    expect(mapFamilyList('serif')).toBe('DejaVu Serif');
    expect(mapFamilyList("'Times New Roman', serif")).toBe("'Times New Roman', DejaVu Serif");
    expect(mapFamilyList(' Monospace ')).toBe(' DejaVu Sans Mono ');
    expect(mapFamilyList('"serif"')).toBe('"serif"'); // a quoted name is a family called "serif", not the keyword
    expect(mapFamilyList('Arial')).toBe('Arial');
    expect(mapFamilyList("'unbalanced, serif")).toBe("'unbalanced, serif");
  });

  it('rewrites attributes, style attributes and style sheets', () => {
    const src = [
      `<svg xmlns="http://www.w3.org/2000/svg">`,
      `<style>text.a { font-family: 'DejaVu Sans', serif !important; } .b{font-family:monospace}</style>`,
      `<text font-family="sans-serif">a</text>`,
      `<text font-family='Georgia, serif'>b</text>`,
      `<text style="fill: red; font-family: 'Courier New', monospace; font-size: 9px" x="1">c</text>`,
      `<text style='font-family:"Helvetica",sans-serif'>d</text>`,
      `</svg>`,
    ].join('\n');
    const out = substituteGenericFamilies(src);
    expect(out).toContain(`font-family: 'DejaVu Sans', DejaVu Serif !important;`);
    expect(out).toContain(`.b{font-family:DejaVu Sans Mono}`);
    expect(out).toContain(`<text font-family="DejaVu Sans">a</text>`);
    expect(out).toContain(`<text font-family='Georgia, DejaVu Serif'>b</text>`);
    expect(out).toContain(`style="fill: red; font-family: 'Courier New', DejaVu Sans Mono; font-size: 9px" x="1"`);
    expect(out).toContain(`style='font-family:"Helvetica",DejaVu Sans'`);
  });

  it('leaves text without font-family untouched', () => {
    const src = '<svg xmlns="http://www.w3.org/2000/svg"><text>serif</text></svg>';
    expect(substituteGenericFamilies(src)).toBe(src);
  });
});

describe('neutralizeExternalRefs', () => {
  it('keeps in-document and data: hrefs', () => {
    expect(isInternalHref('#a')).toBe(true);
    expect(isInternalHref(' data:image/png;base64,AAAA')).toBe(true);
    expect(isInternalHref('DATA:image/png;base64,AAAA')).toBe(true);
    expect(isInternalHref('a.png')).toBe(false);
    expect(isInternalHref('&#35;a')).toBe(false); // spelled with a character reference: replaced, to be safe
    expect(isInternalHref('file:///etc/passwd')).toBe(false);
  });

  it('replaces every other href, with or without a namespace prefix', () => {
    const src = `<svg xmlns="http://www.w3.org/2000/svg" xmlns:xlink="http://www.w3.org/1999/xlink" xmlns:x="http://www.w3.org/1999/xlink">
<image href="/etc/passwd"/><image xlink:href='file:///etc/passwd'/><image x:href="http://127.0.0.1/a.png"/>
<image
  href = "../a.png"/><use href="#keep"/><image href="data:image/png;base64,AAAA"/></svg>`;
    const { text, replaced } = neutralizeExternalRefs(src);
    expect(replaced).toBe(4);
    expect(text).not.toMatch(/passwd|127\.0\.0\.1|a\.png/);
    expect(text).toContain('href="#keep"');
    expect(text).toContain('href="data:image/png;base64,AAAA"');
    expect(text.match(new RegExp(`=\\s*["']${NEUTRAL_HREF}["']`, 'g'))?.length).toBe(4);
  });

  it('limits feImage to fragments and raster data URLs', () => {
    expect(isSafeFilterImageHref('#a')).toBe(true);
    expect(isSafeFilterImageHref('data:image/png;base64,AAAA')).toBe(true);
    expect(isSafeFilterImageHref('data:image/jpeg;base64,AAAA')).toBe(true);
    expect(isSafeFilterImageHref('data:,')).toBe(false);
    expect(isSafeFilterImageHref('data:image/svg+xml,abc')).toBe(false);
    const src = `<svg xmlns="http://www.w3.org/2000/svg"><filter id="f"><feImage result="a>b" href="data:image/svg+xml,x"/></filter><image href="data:image/svg+xml,x"/></svg>`;
    const { text, replaced } = neutralizeExternalRefs(src);
    expect(replaced).toBe(1);
    expect(text).toContain(`<feImage result="a>b" href="${NEUTRAL_HREF}"/>`);
    expect(text).toContain('<image href="data:image/svg+xml,x"/>');
  });

  it('refuses documents that declare entities', () => {
    expect(() => neutralizeExternalRefs('<!DOCTYPE svg [<!ENTITY x "y">]><svg/>')).toThrow(/entities/);
  });
});
