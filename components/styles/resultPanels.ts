import { css } from 'lit';

/** The results column shared by the file-based calculators: headline boxes, what was read, progress, method notes and plots. */
export const resultPanelStyles = css`
  .headlines {
    display: grid;
    gap: 0.5rem 1rem;
    grid-template-columns: repeat(auto-fit, minmax(10rem, 1fr));
    margin: 0.25rem 0 0.5rem;
  }
  .headline-box {
    border: 1px solid var(--_border);
    border-radius: var(--_radius);
    padding: 0.5rem 0.75rem;
    background: var(--_surface);
  }
  .headline-box .label {
    font-size: 0.85rem;
    color: var(--_muted);
    display: block;
  }
  .headline-box .number {
    font-size: 1.8rem;
    display: block;
  }
  .headline-box .small {
    font-size: 1.2rem;
  }
  .reading p {
    margin: 0.4rem 0;
  }
  .busy {
    display: flex;
    flex-wrap: wrap;
    gap: 0.5rem;
    align-items: center;
    margin: 0.5rem 0;
  }
  .busy progress {
    flex: 1 1 12rem;
    height: 1rem;
  }
  .method {
    font-size: 0.85rem;
    color: var(--_muted);
  }
  .plots {
    display: grid;
    gap: 1rem;
  }
  caption,
  .table-title {
    text-align: left;
    font-weight: 600;
    padding-bottom: 0.25rem;
  }
  .table-title {
    margin: 0.75rem 0 0;
  }
`;
