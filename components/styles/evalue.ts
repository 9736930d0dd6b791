import { css } from 'lit';

/** The E-value calculator's own styles; the shared layout is `calculatorLayoutStyles`. */
export const eValueStyles = css`
  table.counts {
    width: auto;
    margin-bottom: 0.5rem;
  }
  table.counts th,
  table.counts td {
    text-align: left;
    vertical-align: top;
    border-bottom: none;
    padding: 0.2rem 0.3rem;
    font-weight: 600;
    font-size: 0.85rem;
  }
  table.counts input {
    width: 6.5rem;
  }
  .values {
    display: flex;
    flex-wrap: wrap;
    gap: 0.15rem 0;
  }
  .evalues {
    display: grid;
    gap: 0.5rem 1rem;
    grid-template-columns: repeat(auto-fit, minmax(11rem, 1fr));
    margin: 0.25rem 0 0.5rem;
  }
  .evalue {
    border: 1px solid var(--_border);
    border-radius: var(--_radius);
    padding: 0.5rem 0.75rem;
    background: var(--_surface);
  }
  .evalue .label {
    font-size: 0.85rem;
    color: var(--_muted);
  }
  .evalue .number {
    font-size: 1.8rem;
    display: block;
  }
  .scale {
    font-size: 0.9rem;
  }
  .confounder {
    display: grid;
    gap: 0 0.5rem;
    grid-template-columns: minmax(0, 1fr) minmax(0, 1fr) auto;
    align-items: end;
    border-bottom: 1px solid var(--_border);
    margin-bottom: 0.6rem;
  }
  .confounder > .field:first-child {
    grid-column: 1 / -1;
    margin-bottom: 0.4rem;
  }
  .confounder button {
    margin-bottom: 0.75rem;
  }
  .verdicts {
    padding-left: 1.1rem;
  }
  .verdicts li {
    margin-bottom: 0.35rem;
  }
  .waiting {
    color: var(--_muted);
    font-style: italic;
  }
`;
