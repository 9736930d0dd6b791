import { css } from 'lit';
import { resultPanelStyles } from './resultPanels';

/** The weighting calculator's styles: the shared results column and the covariate checkboxes; the shared layout is `calculatorLayoutStyles`. */
export const weightingStyles = [
  resultPanelStyles,
  css`
    .checks {
      display: flex;
      flex-wrap: wrap;
      gap: 0.25rem 1rem;
    }
  `,
];
