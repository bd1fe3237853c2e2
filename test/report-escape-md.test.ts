/**
 * Markdown escaping of text taken from charts. Each hostile string is
 * escaped, put into a paragraph, a list item, a table cell and a <summary>,
 * and rendered with micromark and its GFM extension (a CommonMark and GFM
 * reference implementation, raw HTML allowed as GitHub allows some). The
 * rendered HTML must contain no element or link the input asked for, and the
 * visible text must equal the input (line breaks as spaces, invisible joiners
 * aside).
 */
import { micromark } from 'micromark';
import { gfm, gfmHtml } from 'micromark-extension-gfm';
import { describe, expect, it } from 'vitest';
import { escapeMarkdown, escapeMarkdownShort } from '../engine/report/escape-md.js';

const render = (md: string): string =>
  micromark(md, { allowDangerousHtml: true, extensions: [gfm()], htmlExtensions: [gfmHtml()] });

/** Text content of rendered HTML: tags dropped, the entities micromark writes decoded. */
function visibleText(html: string): string {
  return html
    .replace(/<[^>]*>/g, '')
    .replace(/&quot;/g, '"')
    .replace(/&lt;/g, '<')
    .replace(/&gt;/g, '>')
    .replace(/&amp;/g, '&')
    .replace(/[\u200b\u200d]/g, '')
    .trim();
}

/** Tags in rendered HTML. */
const tags = (html: string): string[] => [...html.matchAll(/<([a-z][a-z0-9]*)\b/gi)].map((m) => m[1]!.toLowerCase());

const HOSTILE = [
  '<img src=x onerror=alert(1)>',
  '](javascript:alert(1))',
  '[click](javascript:alert(1))',
  '![x](https://example.invalid/t.png)',
  '@octocat please look',
  '| pipes | in | cells |',
  '**bold** _em_ ~~strike~~ `code`',
  '# heading',
  '- list item',
  '1. ordered',
  '> quote',
  '<script>alert(1)</script>',
  '<details open><summary>x</summary>',
  'line one\nline two\r\n| a | b |',
  'see #12 and www.example.invalid or https://example.invalid/x',
  '$\\huge{x}$ and $$y$$',
  '&lt;img&gt; already escaped &amp;',
  'back\\slash \\* star',
  '<!-- comment --> tail',
  'Planned ≠ “delivered” — 5 %',
  '    indented code',
  '\u202eevil\u202c text',
];

describe('escapeMarkdown', () => {
  for (const input of HOSTILE) {
    it(`renders ${JSON.stringify(input)} as plain text in a paragraph`, () => {
      const html = render(escapeMarkdown(input));
      // common practice, no source: a paragraph of plain text has exactly one <p> element
      expect(tags(html)).toEqual(['p']);
      const expected = input.replace(/\r\n|[\r\n]/g, ' ').replace(/[\u202a-\u202e]/g, '').replace(/^ +/, '');
      expect(visibleText(html)).toBe(expected.trim());
    });

    it(`keeps ${JSON.stringify(input)} inside one table cell`, () => {
      const md = `| a | b |\n|---|---|\n| ${escapeMarkdown(input)} | end |\n`;
      const html = render(md);
      // GFM spec 0.29, section 4.10 (tables): a row splits into cells at unescaped pipes
      expect(tags(html).filter((t) => t === 'td')).toHaveLength(2);
      expect(tags(html).filter((t) => !['table', 'thead', 'tbody', 'tr', 'th', 'td'].includes(t))).toEqual([]);
      expect(html).toContain('<td>end</td>');
    });

    it(`stays text in a list item and in a <summary>`, () => {
      const list = render(`- ${escapeMarkdown(input)}\n- next`);
      expect(tags(list)).toEqual(['ul', 'li', 'li']);
      const details = render(`<details>\n<summary>${escapeMarkdown(input)}</summary>\n\nbody\n\n</details>`);
      expect(tags(details).filter((t) => !['details', 'summary', 'p'].includes(t))).toEqual([]);
    });
  }

  it('breaks @mentions, issue references and bare links with invisible characters', () => {
    // from memory: GitHub links @name, #123 and bare URLs in the rendered text, so entity references alone do not stop it
    const out = escapeMarkdown('@octocat #12 https://example.invalid www.example.invalid');
    expect(out).not.toMatch(/@[A-Za-z0-9]/);
    expect(out).not.toMatch(/https?:\/\//);
    expect(out).not.toMatch(/www\./i);
    expect(visibleText(render(out))).toBe('@octocat #12 https://example.invalid www.example.invalid');
  });

  it('leaves colour codes that are not issue references alone', () => {
    expect(visibleText(render(escapeMarkdown('#55a868')))).toBe('#55a868');
    expect(escapeMarkdown('#55a868')).not.toContain('\u200d');
  });

  it('contains none of the characters Markdown treats as syntax', () => {
    const all = HOSTILE.map(escapeMarkdown).join(' ');
    expect(all).not.toMatch(/[<>"'`[\]()*_~|!\\$]/);
    expect(all).not.toMatch(/[\r\n]/);
  });

  it('cuts long text on whole characters with an ellipsis', () => {
    expect(escapeMarkdownShort('abcdef', 4)).toBe('abc…');
    expect(escapeMarkdownShort('😀😀😀😀', 3)).toBe('😀😀…');
    expect(escapeMarkdownShort('ab', 4)).toBe('ab');
  });
});
