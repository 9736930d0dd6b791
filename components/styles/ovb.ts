import { css } from 'lit';

/** The regression (omitted-variable bias) calculator's own styles; the shared layout is `calculatorLayoutStyles`. */
export const ovbStyles = css`
  .triple {
    display: grid;
    gap: 0 0.5rem;
    grid-template-columns: minmax(0, 1fr) minmax(0, 1fr) auto;
    align-items: end;
  }
  .covariate {
    border-bottom: 1px solid var(--_border);
    margin-bottom: 0.5rem;
  }
  .columns {
    max-height: 12rem;
    overflow-y: auto;
    border: 1px solid var(--_border);
    border-radius: var(--_radius);
    padding: 0.25rem 0.5rem;
  }
  .columns .choice {
    display: flex;
    margin: 0.15rem 0;
  }
  .run {
    display: flex;
    flex-wrap: wrap;
    gap: 0.5rem;
    align-items: center;
    margin: 0.5rem 0;
  }
  progress {
    width: 100%;
    height: 0.9rem;
  }
  .numbers {
    display: grid;
    gap: 0.5rem 1rem;
    grid-template-columns: repeat(auto-fit, minmax(10rem, 1fr));
    margin: 0.5rem 0 0.75rem;
  }
  .numbers div {
    background: var(--_surface);
    border-radius: var(--_radius);
    padding: 0.5rem 0.75rem;
  }
  .numbers .label {
    display: block;
    font-size: 0.85rem;
    color: var(--_muted);
  }
  .numbers .number {
    font-size: 1.35rem;
  }
  pre.sql {
    background: var(--_surface);
    border: 1px solid var(--_border);
    border-radius: var(--_radius);
    padding: 0.5rem;
    overflow-x: auto;
    font-size: 0.8rem;
    max-height: 16rem;
  }
  textarea {
    min-height: 5rem;
    font-family: ui-monospace, SFMono-Regular, Menlo, Consolas, monospace;
    font-size: 0.85rem;
  }
  .plots {
    display: grid;
    gap: 1rem;
  }
  td.unavailable {
    text-align: left;
    color: var(--_muted);
  }
  button.small {
    padding: 0.2rem 0.5rem;
    min-height: 2rem;
    font-size: 0.85rem;
  }
`;
