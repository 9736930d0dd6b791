import type { StudyLabels } from '../io/studyLabels';

/**
 * The demo: an invented study, clearly marked fictional, with every calculator filled in so that a newcomer
 * sees everything working at once. No real study's data.
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
      pairs: {},
      regression: {},
    },
  };
}
