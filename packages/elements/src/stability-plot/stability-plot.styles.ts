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
  .table-wrap { max-height: 260px; overflow: auto; }
  th { white-space: normal; }
  th, td { padding: 3px 6px; }
  :host([no-table]) .table-wrap {
    position: absolute; width: 1px; height: 1px; overflow: hidden; clip: rect(0 0 0 0); white-space: nowrap;
  }
`;
