import { css } from 'lit';
import { resultPanelStyles } from './resultPanels';

/** The matched-pairs (and matched-sets) calculator's styles: the shared results column and the pasted-numbers box; the shared layout is `calculatorLayoutStyles`. */
export const pairsStyles = [
  resultPanelStyles,
  css`
    textarea {
      min-height: 8rem;
      font-family: ui-monospace, SFMono-Regular, Menlo, Consolas, monospace;
      font-size: 0.9rem;
    }
  `,
];
