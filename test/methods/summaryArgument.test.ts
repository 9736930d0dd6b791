import { describe, expect, it } from 'vitest';
import { isInlineResult, readSummaryArgument } from '../../src/methods/summaryArgument';
import type { CommandContext } from '../../src/methods/methodModule';

const context = (files: Record<string, string>): CommandContext => ({
  open: (path) => ({
    name: path === '-' ? 'standard input' : path,
    size: null,
    text: async () => {
      if (path in files) return files[path];
      throw Object.assign(new Error('no such file'), { code: 'ENOENT' });
    },
    bytes: () => {
      throw new Error('not used');
    },
  }),
});

describe('the one rule for --summary ROW', () => {
  it('text starting with { or [, or holding a line break, is the result itself; anything else names a file ("-": standard input)', async () => {
    expect(isInlineResult(' {"a": 1}')).toBe(true);
    expect(isInlineResult('[{"a": 1}]')).toBe(true);
    expect(isInlineResult('a,b\n1,2')).toBe(true);
    expect(isInlineResult('result.csv')).toBe(false);
    expect(isInlineResult('-')).toBe(false);
    const files = { 'result.csv': 'a,b\n1,2\n', '-': '{"a": 1}' };
    expect(await readSummaryArgument('result.csv', context(files), 'summaryResult')).toBe('a,b\n1,2\n');
    expect(await readSummaryArgument('-', context(files), 'summaryResult')).toBe('{"a": 1}');
    expect(await readSummaryArgument('{"b": 2}', context(files), 'summaryResult')).toBe('{"b": 2}');
    await expect(readSummaryArgument('missing.csv', context(files), 'summaryResult')).rejects.toThrow(/cannot read "missing.csv"/);
  });
});
