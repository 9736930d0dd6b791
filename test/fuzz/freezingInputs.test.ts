// Inputs that once froze the tab or the command: a billion discordant pairs. The binomial tails behind the sign
// test are computed in constant time now, so they finish at once on every surface (speed itself is measured in
// bench/, not asserted here; a regression shows as this file timing out).
import { describe, expect, it } from 'vitest';
import { runLurk } from '../../src/cli/main';
import { memoryIo } from '../../src/cli/cliIo';
import { pairsMethod } from '../../src/methods/pairs/method';
import { analysePairsForm } from '../../src/methods/pairs/runner';
import { decodeShareFragment, encodeShareFragment } from '../../src/workspace/shareLink';
import { createAppraisal } from '../../src/workspace/appraisal';
import { buildRobustnessStatement, renderRobustnessStatement } from '../../src/workspace/robustnessStatement';
import { expectCleanText } from './hostileInput';

const study = { finding: 'A fictional finding', exposure: 'the treatment', outcome: 'the event', units: '', source: 'invented' };

describe('discordant counts 1e9 and 999e6 finish', () => {
  it('on the command line (lurk pairs --discordant 1e9,999e6)', async () => {
    const io = memoryIo();
    expect(await runLurk(['pairs', '--discordant', '1e9,999e6'], io)).toBe(0);
    expect(io.stdout).toContain('1,999,000,000 pairs used');
    expectCleanText(io.stdout, 'lurk pairs');
  }, 10_000);

  it("through the page's request reader, and through a share link's statement", () => {
    const form = { ...pairsMethod.form.empty(), source: 'discordant' as const, treatedOnly: '1e9', controlOnly: '999e6' };
    const outcome = analysePairsForm(form as never, null);
    expect(outcome.problems).toEqual([]);
    expect(outcome.result).not.toBeNull();
    const link = encodeShareFragment(createAppraisal(study, { pairs: { inputs: form, summary: null } }));
    const decoded = decodeShareFragment(link);
    expect(decoded.problems).toEqual([]);
    const md = renderRobustnessStatement(buildRobustnessStatement(decoded.appraisal!), 'md');
    expect(md).toContain('1999000000 matched pairs');
    expectCleanText(md, 'statement');
  }, 10_000);
});
