import { css } from 'lit';

/** Styles of `<tauline-stability-plot>`. */
export const stabilityPlotStyles = css`
  :host {
    --series-1: var(--tauline-color-series-1, light-dark(#2f5d9e, #8fb4ec));
    --series-2: var(--tauline-color-series-2, light-dark(#a4452c, #f0a58c));
    --series-3: var(--tauline-color-series-3, light-dark(#3f7d3a, #9bd28f));
    --series-4: var(--tauline-color-series-4, light-dark(#7a4f9a, #c9a6e6));
    --series-5: var(--tauline-color-series-5, light-dark(#8a6d1e, #e3c56f));
    --series-6: var(--tauline-color-series-6, light-dark(#2b7a7e, #86d0d3));
    --plot-height: 300px;
  }
  /* Header (two lines) + 11 rows of 24 px: the table is windowed, so rows have a fixed height. */
  .table-wrap { max-height: 320px; overflow: auto; overscroll-behavior: contain; }
  thead th { position: sticky; top: 0; background: var(--surface); z-index: 1; white-space: normal; }
  th, td { padding: 0 6px; }
  tbody tr { height: 24px; }
  tbody th, tbody td { white-space: nowrap; }
  tr.spacer td { padding: 0; border: 0; }
  [part~='legend'] li { display: block; }
  .series-toggle { display: inline-flex; align-items: center; gap: 6px; border-color: transparent; color: var(--text); padding: 1px 6px; }
  .series-toggle[aria-pressed='false'] { color: var(--muted); text-decoration: line-through; opacity: 0.75; }
  .note, .table-units { margin: 0; color: var(--muted); font-size: 0.92em; }
`;
