import { css } from 'lit';

/** The workspace's own layout: header, toolbar, tabs, panels and banners. */
export const appStyles = css`
      :host {
        max-width: 1180px;
        margin: 0 auto;
        padding: 0 1rem 3rem;
      }
      header.app {
        display: flex;
        flex-wrap: wrap;
        align-items: baseline;
        gap: 0.25rem 1rem;
        padding: 1rem 0 0.5rem;
      }
      header.app h1 {
        margin: 0;
        font-size: 1.6rem;
        letter-spacing: 0.02em;
      }
      header.app p {
        margin: 0;
        color: var(--_muted);
      }
      .privacy {
        font-size: 0.85rem;
        color: var(--_muted);
        margin: 0 0 0.75rem;
      }
      [role='tablist'] {
        display: flex;
        flex-wrap: wrap;
        gap: 0.25rem;
        border-bottom: 2px solid var(--_border);
        margin-top: 0.75rem;
      }
      [role='tab'] {
        background: var(--_surface);
        color: var(--_text);
        border: 1px solid var(--_border);
        border-bottom: none;
        border-radius: var(--_radius) var(--_radius) 0 0;
        padding: 0.5rem 0.9rem;
      }
      [role='tab'][aria-selected='true'] {
        background: var(--_accent);
        color: var(--_accent-text);
        border-color: var(--_accent);
      }
      [role='tabpanel'] {
        padding-top: 0.5rem;
      }
      .toolbar {
        display: flex;
        flex-wrap: wrap;
        gap: 0.4rem;
        align-items: center;
        margin-bottom: 0.5rem;
      }
      .toolbar button,
      .file-button {
        padding: 0.3rem 0.7rem;
        font-size: 0.9rem;
        min-height: 2.1rem;
      }
      .file-button {
        display: inline-flex;
        align-items: center;
        margin: 0;
        font-weight: normal;
        border: 1px solid var(--_accent);
        border-radius: var(--_radius);
        color: var(--_accent);
        background: var(--_bg);
        cursor: pointer;
      }
      #open-appraisal:focus-visible + .file-button,
      .file-button:focus-within {
        outline: 3px solid var(--_focus);
      }
      .notice {
        font-size: 0.9rem;
        color: var(--_muted);
      }
      .demo-banner {
        background: var(--_warning-bg);
        border-radius: var(--_radius);
        padding: 0.5rem 0.75rem;
        margin: 0.5rem 0;
        font-size: 0.9rem;
      }
    `;
