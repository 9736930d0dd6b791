// The shipped JSON Schema of appraisal files against the registry of methods, and its compiled validator.
import { execFileSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import schema from '../../src/workspace/appraisal.schema.json';
import { createAppraisal, readAppraisal } from '../../src/workspace/appraisal';
import { buildRobustnessStatement, renderRobustnessStatement } from '../../src/workspace/robustnessStatement';
import { METHODS } from '../../src/methods/registry';
import { fictionalStudy } from '../../src/demo/fictionalStudy';
import { runLurk } from '../../src/cli/main';
import { memoryIo } from '../../src/cli/cliIo';

type Defs = Record<string, { properties: { inputs: { properties: Record<string, unknown> }; summary: unknown } }>;
const defs = schema.$defs as unknown as Defs;

describe('the appraisal schema covers every method of the registry', () => {
  it('has one calculator entry per method id, and no other (version 1), and a finding may name each method (version 2)', () => {
    expect(Object.keys(schema.$defs.version1.properties.calculators.properties).sort()).toEqual(METHODS.map((m) => m.id).sort());
    expect([...schema.$defs.finding.properties.method.enum].sort()).toEqual(METHODS.map((m) => m.id).sort());
    expect(schema.$defs.finding.allOf.map((branch) => branch.then.$ref)).toEqual(METHODS.map((m) => `#/$defs/${m.id}`));
  });

  it("names every field of each method's form", () => {
    for (const method of METHODS) {
      const fields = Object.keys(defs[method.id].properties.inputs.properties).sort();
      expect(fields, method.id).toEqual(Object.keys(method.form.empty() as object).sort());
    }
  });

  it("accepts every method's own summary of the fictional demo study, and its empty form", () => {
    const demo = fictionalStudy();
    const calculators: Record<string, { inputs: Record<string, unknown>; summary: unknown }> = {};
    for (const method of METHODS) {
      const form = method.form.normalise((demo.inputs as Record<string, unknown>)[method.id]);
      // A method whose demo needs a data file (never saved) has no summary from its inputs alone.
      if (method.workspace.needsData(form)) continue;
      const summary = method.workspace.summaryFromForm(form);
      expect(summary, method.id).not.toBeNull();
      calculators[method.id] = { inputs: form as Record<string, unknown>, summary };
    }
    const read = readAppraisal(JSON.parse(JSON.stringify(createAppraisal(demo.study, calculators as never))));
    expect(read.problems).toEqual([]);
    const empty = Object.fromEntries(METHODS.map((m) => [m.id, { inputs: m.form.empty(), summary: null }]));
    expect(readAppraisal(JSON.parse(JSON.stringify(createAppraisal(demo.study, empty as never)))).problems).toEqual([]);
  });

  it('the compiled validator is up to date with the schema', () => {
    const script = fileURLToPath(new URL('../../src/workspace/buildAppraisalValidator.mjs', import.meta.url));
    expect(() => execFileSync(process.execPath, [script, '--check'], { stdio: 'pipe' })).not.toThrow();
  });
});

describe('inputs saved as numbers instead of text', () => {
  // VanderWeele & Ding 2017 worked example: RR 3.9 (1.8–8.7) → E-values 7.26 and 3.00.
  const appraisal = {
    format: 'lurk-appraisal',
    version: 1,
    savedAt: '2026-01-02T03:04:05Z',
    study: { finding: 'A fictional finding', exposure: 'the exposure', outcome: 'the outcome', units: '', source: 'invented' },
    calculators: { evalue: { inputs: { source: 'reported', measure: 'rr', estimate: 3.9, lower: 1.8, upper: 8.7 }, summary: null } },
  };

  it('open with the number’s text and give the same statement', () => {
    const read = readAppraisal(appraisal);
    expect(read.problems).toEqual([]);
    const md = renderRobustnessStatement(buildRobustnessStatement(read.appraisal!), 'md');
    expect(md).toContain('risk ratio 3.9');
    expect(md).toContain('is 7.26');
    expect(read.appraisal?.findings[0].name).toBe('Reported estimate');
    expect(METHODS[0].form.normalise(appraisal.calculators.evalue.inputs)).toMatchObject({ estimate: '3.9', lower: '1.8', upper: '8.7' });
  });

  it('lurk report prints it', async () => {
    const io = memoryIo({ 'a.json': JSON.stringify(appraisal) });
    expect(await runLurk(['report', 'a.json'], io)).toBe(0);
    expect(io.stdout).toContain('is 7.26');
  });
});
