import { css } from 'lit';

/** Styles of `<tauline-rate-budget>`. */
export const rateBudgetStyles = css`
  :host {
    --gain-color: var(--tauline-color-gain, light-dark(#a4452c, #f0a58c));
    --loss-color: var(--tauline-color-loss, light-dark(#2d6a8f, #8cc4e6));
    --total-color: var(--tauline-color-total, light-dark(#3b3f4a, #d8d6cf));
  }
  .summary { margin: 0; color: var(--muted); }
  .summary strong { color: var(--text); font-weight: 600; }
  :host { container-type: inline-size; }
  .table-scroll { overflow-x: auto; }
  /* Narrow containers: tighter cells, then the bars go (the signed numbers carry the same information). */
  @container (max-width: 560px) { th, td { padding: 3px 4px; } td.bar-cell { min-width: 44px; width: 18%; } .axis-note { display: none; } }
  /* Phones: each part becomes a small card, every value on its own line with its column's name. */
  @container (max-width: 440px) {
    .bar-cell, .bar-col { display: none; }
    table, tbody, tr, tbody th, td { display: block; }
    thead { position: absolute; width: 1px; height: 1px; overflow: hidden; clip: rect(0 0 0 0); }
    tr { padding: 4px 0; border-bottom: 1px solid var(--grid); }
    tbody th, td { border: 0; padding: 1px 2px; }
    td { display: flex; justify-content: space-between; gap: 12px; }
    td::before { content: attr(data-label); color: var(--muted); font-weight: 400; text-align: left; }
    tr.total td { border-top: 0; }
  }
  th { white-space: normal; }
  th, td { padding: 3px 6px; }
  td.bar-cell { width: 30%; min-width: 70px; padding-left: 0; padding-right: 0; }
  .bar-track { position: relative; height: 14px; }
  .bar-track::before {
    content: ''; position: absolute; left: 50%; top: -3px; bottom: -3px; border-left: 1px solid var(--border);
  }
  .bar { position: absolute; top: 2px; height: 10px; border-radius: 2px; }
  .bar.gain { background: var(--gain-color); }
  .bar.loss { background: repeating-linear-gradient(135deg, var(--loss-color) 0 3px, transparent 3px 5px); border: 1px solid var(--loss-color); }
  .bar.total { background: var(--total-color); height: 6px; top: 4px; }
  tr.total td { font-weight: 600; border-top: 1px solid var(--border); }
  .na { color: var(--muted); }
  .note, .table-note { margin: 0; color: var(--muted); font-size: 0.92em; }
  .bar-col { text-align: center; }
  .axis-note { font-weight: 400; white-space: nowrap; }
  .caution { margin: 0; padding: 4px 10px; border-left: 3px solid var(--tauline-color-tolerance, light-dark(#b7791f, #e0b062)); color: var(--muted); font-size: 0.92em; }
`;
