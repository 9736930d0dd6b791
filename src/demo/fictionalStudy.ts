import type { StudyLabels } from '../format/studyLabels';
import { createAppraisal, type Appraisal, type Finding } from '../workspace/appraisal';
import { methodById } from '../methods/registry';

/**
 * The demo: an invented study, clearly marked fictional, with every calculator filled in so that a newcomer
 * sees everything working at once. No real study's data: every number below is made up for the demo.
 */
export interface DemoAppraisal {
  readonly banner: string;
  readonly study: StudyLabels;
  readonly inputs: Record<'evalue' | 'pairs' | 'regression', Record<string, unknown>>;
}

export function fictionalStudy(): DemoAppraisal {
  return {
    banner:
      'Fictional demo: the Harbourtown commuter study below is invented to show how Lurk works. Its numbers describe no real people. Replace them with your own.',
    study: Object.freeze({
      finding: 'Cycling to work and blood pressure (fictional Harbourtown commuter study)',
      exposure: 'cycling to work',
      outcome: 'blood pressure',
      units: 'mmHg',
      source: 'Invented for this demo; not a real study.',
    }),
    inputs: {
      // A reported finding of the fictional study: cyclists had a lower 5-year risk of high blood pressure.
      evalue: {
        source: 'reported',
        measure: 'rr',
        estimate: '0.72',
        intervalBy: 'limits',
        lower: '0.61',
        upper: '0.85',
        level: '95',
        confounders: [
          { name: 'leisure-time exercise', rrExposure: '1.8', rrOutcome: '1.5' },
          { name: 'smoking', rrExposure: '1.3', rrOutcome: '1.6' },
        ],
      },
      // Each cycling commuter matched to a car commuter of the same age band, sex and neighbourhood; the pasted
      // numbers are the differences in systolic blood pressure (cyclist − driver, mmHg).
      pairs: {
        source: 'pasted',
        pasted: fictionalPairDifferences().join('\n'),
        test: 'signrank',
        alternative: 'less',
        alpha: '0.05',
        gammas: '',
        method: 'auto',
      },
      // The fictional paper's regression table: systolic blood pressure on cycling (yes/no) and covariates.
      regression: {
        source: 'reported',
        estimate: '-4.1',
        se: '1.2',
        dfBy: 'df',
        df: '1482',
        covariateTs: [
          { name: 'age', outcomeT: '9.5', treatmentT: '-3.1' },
          { name: 'body-mass index', outcomeT: '7.2', treatmentT: '-2.0' },
          { name: 'smoking', outcomeT: '2.8', treatmentT: '-1.5' },
        ],
        k: '1, 2, 3',
        q: '1',
        alpha: '0.05',
        direction: 'toward-zero',
      },
    },
  };
}

/** The names of the demo's findings, one per calculator filled in (fictional). */
const DEMO_FINDING_NAMES: Record<keyof DemoAppraisal['inputs'], string> = {
  evalue: 'High blood pressure within 5 years, risk ratio',
  pairs: 'Systolic blood pressure, matched pairs',
  regression: 'Systolic blood pressure, regression coefficient',
};

/** The demo's findings whose outcome is not the study's (the risk ratio is of high blood pressure, not of mmHg). */
const DEMO_FINDING_LABELS: Partial<Record<keyof DemoAppraisal['inputs'], Finding['labels']>> = {
  evalue: { outcome: 'high blood pressure within 5 years' },
};

/**
 * The demo as an appraisal of three findings (ids f1, f2, f3), each with its name, its inputs completed and,
 * with `withSummaries`, the summary its inputs give (as the page holds it once computed).
 */
export function fictionalAppraisal(withSummaries = false, savedAt = new Date()): Appraisal {
  const demo = fictionalStudy();
  const findings: Finding[] = (Object.keys(DEMO_FINDING_NAMES) as (keyof DemoAppraisal['inputs'])[]).map((id, i) => {
    const method = methodById(id)!;
    const inputs = method.form.normalise(demo.inputs[id]) as Record<string, unknown>;
    const summary = withSummaries ? (method.workspace.summaryFromForm(inputs) as Finding['summary']) : null;
    const labels = DEMO_FINDING_LABELS[id];
    return { id: `f${i + 1}`, method: id, name: DEMO_FINDING_NAMES[id], ...(labels ? { labels } : {}), inputs, summary };
  });
  return createAppraisal(demo.study, findings, savedAt);
}

/**
 * 90 invented pair differences, drawn once from a fixed-seed generator (a linear congruential generator and
 * the Box–Muller transform) around −3.5 mmHg with spread 9 mmHg, rounded to 0.5 mmHg as a cuff reads.
 */
export function fictionalPairDifferences(): number[] {
  let seed = 20261202;
  const uniform = () => ((seed = (Math.imul(seed, 1664525) + 1013904223) >>> 0) + 0.5) / 2 ** 32;
  const values: number[] = [];
  while (values.length < 90) {
    const radius = Math.sqrt(-2 * Math.log(uniform()));
    const angle = 2 * Math.PI * uniform();
    values.push(Math.round((-3.5 + 9 * radius * Math.cos(angle)) * 2) / 2);
  }
  return values;
}
