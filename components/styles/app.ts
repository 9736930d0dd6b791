import { css } from 'lit';

/** The workspace's own layout: header, toolbar, tabs, panels and banners. */
export const appStyles = css`
      :host {
        display: block;
        box-sizing: border-box;
        max-width: 1180px;
        min-width: 0;
        margin: 0 auto;
        padding: 0 1rem 3rem;
        overflow-wrap: anywhere;
      }
      [role='tabpanel'],
      .study-fold {
        min-width: 0;
        max-width: 100%;
      }
      /* Inside <details> an element inherits through the browser's own slot (content-box): set it again. */
      .study-fold > :not(summary) {
        box-sizing: border-box;
      }
      .study-fold > summary {
        cursor: pointer;
        padding: 0.35rem 0;
        display: flex;
        gap: 0.5rem;
        align-items: baseline;
        min-width: 0;
      }
      .study-fold > summary::-webkit-details-marker {
        display: none;
      }
      .fold-label {
        font-weight: 600;
      }
      .fold-label::before {
        content: '▸ ';
        color: var(--_accent);
      }
      .study-fold[open] .fold-label::before {
        content: '▾ ';
      }
      .fold-finding {
        color: var(--_muted);
        white-space: nowrap;
        overflow: hidden;
        text-overflow: ellipsis;
        min-width: 0;
        flex: 1;
      }
      .study-fold[open] .fold-finding {
        display: none;
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
        white-space: nowrap;
      }
      /* Narrow screens: the study header folds, the tabs scroll sideways in their own strip (never the page). */
      @media (max-width: 640px) {
        :host {
          padding: 0 0.6rem 2rem;
        }
        header.app {
          padding: 0.5rem 0 0.25rem;
        }
        header.app h1 {
          font-size: 1.3rem;
        }
        header.app p,
        .privacy {
          font-size: 0.85rem;
        }
        .demo-banner {
          font-size: 0.8rem;
          padding: 0.35rem 0.5rem;
          margin: 0.25rem 0;
        }
        [role='tablist'] {
          flex-wrap: nowrap;
          overflow-x: auto;
          overscroll-behavior-x: contain;
          scroll-snap-type: x proximity;
          scrollbar-width: thin;
          margin-top: 0.4rem;
        }
        [role='tab'] {
          flex: none;
          scroll-snap-align: start;
          padding: 0.45rem 0.7rem;
        }
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
      .finding-bar {
        display: flex;
        flex-wrap: wrap;
        gap: 0.4rem 0.75rem;
        align-items: center;
        margin: 0.75rem 0 0.5rem;
        font-size: 0.9rem;
      }
      .finding-bar button {
        padding: 0.25rem 0.6rem;
        font-size: 0.85rem;
        min-height: 2.1rem;
      }
      .finding-bar .editing {
        font-weight: 600;
      }
      .demo-banner {
        background: var(--_warning-bg);
        border-radius: var(--_radius);
        padding: 0.5rem 0.75rem;
        margin: 0.5rem 0;
        font-size: 0.9rem;
      }
    `;
