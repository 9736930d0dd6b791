import { describe, expect, it } from 'vitest';
import { escapeHtml, escapeLatex, escapeMarkdown } from '../../src/format/markup';

describe('escaping user text for markups', () => {
  it('Markdown: a link or image typed by a user is not live', () => {
    const text = escapeMarkdown('see [here](javascript:alert(1)) and ![x](http://a/b.png)');
    expect(text).not.toMatch(/(^|[^\\])\[here\]\(/);
    expect(text).toContain('\\[here\\]');
    expect(text).toContain('\\!\\[x\\]');
  });

  it('Markdown: "p < 0.0001" stays plain, an HTML tag does not', () => {
    expect(escapeMarkdown('p < 0.0001')).toBe('p < 0.0001');
    expect(escapeMarkdown('<script>')).toBe('\\<script>');
  });

  it('LaTeX: comparison signs and minus signs go to math mode', () => {
    expect(escapeLatex('p < 0.0001')).toBe('p $<$ 0.0001');
    expect(escapeLatex('estimate -0.4 (−0.6 to -0.2)')).toBe('estimate $-$0.4 ($-$0.6 to $-$0.2)');
    expect(escapeLatex('well-known')).toBe('well-known');
    expect(escapeLatex('Γ ≥ 1.5')).toBe('$\\Gamma$ $\\geq$ 1.5');
  });

  it('HTML: every markup character is an entity', () => {
    expect(escapeHtml('<b>"a" & \'b\'</b>')).toBe('&lt;b&gt;&quot;a&quot; &amp; &#39;b&#39;&lt;/b&gt;');
  });
});

describe('escapeLatex: a vertical bar', () => {
  it('writes "|" as \\textbar{} (in OT1 text mode a bare "|" prints as a dash)', () => {
    expect(escapeLatex('R²(Y~Z|D,X)')).toBe('R$^2$(Y\\textasciitilde{}Z\\textbar{}D,X)');
  });
});
