import { css } from 'lit';

/** Styles of `<tauline-review-findings>`. */
export const reviewFindingsStyles = css`
  :host {
    --pass-color: var(--tauline-color-pass, light-dark(#2e6b34, #8fd197));
    --marginal-color: var(--tauline-color-marginal, light-dark(#8a5a00, #e9bd5b));
    --fail-color: var(--tauline-color-fail, light-dark(#b3261e, #f2958e));
  }
  .counts { display: flex; flex-wrap: wrap; gap: 6px 14px; margin: 0; padding: 0; list-style: none; }
  .verdict { display: inline-flex; align-items: center; gap: 5px; font-weight: 600; }
  .verdict svg { flex: none; }
  .verdict.pass { color: var(--pass-color); }
  .verdict.marginal { color: var(--marginal-color); }
  .verdict.fail { color: var(--fail-color); }
  .caution { margin: 0; padding: 6px 10px; border-left: 3px solid var(--marginal-color); color: var(--muted); }
  [part~='finding'] { border: 1px solid var(--border); border-radius: var(--radius); }
  [part~='finding'][data-verdict='fail'] { border-left: 4px solid var(--fail-color); }
  [part~='finding'][data-verdict='marginal'] { border-left: 4px dashed var(--marginal-color); }
  [part~='finding'][data-verdict='pass'] { border-left: 4px solid transparent; }
  summary {
    display: grid; grid-template-columns: 8.5em minmax(6em, 1fr) auto; gap: 4px 12px; align-items: baseline;
    padding: 6px 10px; cursor: pointer; list-style: none;
  }
  summary::-webkit-details-marker { display: none; }
  summary::before { content: '▸'; position: absolute; margin-left: -9px; color: var(--muted); }
  details[open] > summary::before { content: '▾'; }
  .sc-id { font-weight: 600; }
  .diff { color: var(--muted); font-variant-numeric: tabular-nums; text-align: right; }
  .body { padding: 4px 12px 10px; display: flex; flex-direction: column; gap: 8px; }
  .body p { margin: 0; }
  .diagnosis { margin: 0; padding-left: 1.2em; }
  .diagnosis li { margin: 2px 0; }
  .diagnosis code { font-size: 0.92em; color: var(--muted); }
  .match { font-weight: 600; color: var(--fail-color); }
  .list { display: flex; flex-direction: column; gap: 6px; }
  .notice { padding: 6px 10px; border: 1px solid var(--fail-color); border-radius: var(--radius); }
`;
