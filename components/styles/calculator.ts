import { css } from 'lit';

/**
 * Layout shared by the calculators: inputs beside results on wide screens, stacked on narrow ones;
 * a wrapping row of source choices and a two-column pair of fields.
 */
export const calculatorLayoutStyles = css`
  .layout {
    display: grid;
    gap: 1rem 1.5rem;
    grid-template-columns: minmax(0, 22rem) minmax(0, 1fr);
    align-items: start;
  }
  @media (max-width: 760px) {
    .layout {
      grid-template-columns: minmax(0, 1fr);
    }
  }
  .sources {
    display: flex;
    flex-wrap: wrap;
    gap: 0.25rem 0;
  }
  .pair {
    display: grid;
    gap: 0 0.75rem;
    grid-template-columns: repeat(2, minmax(0, 1fr));
  }
`;
