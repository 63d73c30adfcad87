import { css } from 'lit';

/** The canvas colours of `<tauline-fleet-timeline>`, as CSS expressions resolved on the element. */
export const FLEET_COLOR_EXPR = {
  text: 'var(--text)',
  muted: 'var(--muted)',
  grid: 'var(--grid)',
  surface: 'var(--surface)',
  accent: 'var(--accent)',
  margin: 'var(--margin-color)',
  risk: 'var(--risk-color)',
  support: 'var(--support-color)',
  setup: 'var(--setup-color)',
  pass: 'var(--pass-color)',
  frequency: 'var(--frequency-command-color)',
  phase: 'var(--phase-command-color)',
} as const;

/** Styles of `<tauline-fleet-timeline>`. */
export const fleetTimelineStyles = css`
  :host {
    --margin-color: var(--tauline-color-steered, light-dark(#1d6b63, #6fd3c4));
    --risk-color: var(--tauline-color-fail, light-dark(#b3261e, #f2958e));
    --support-color: var(--tauline-color-contact, light-dark(#56729a, #8ea6cc));
    --setup-color: var(--tauline-color-muted, light-dark(#5b6373, #9aa1ad));
    --pass-color: var(--tauline-color-contact, light-dark(#56729a, #8ea6cc));
    --frequency-command-color: var(--tauline-color-command-frequency, light-dark(#2f4f9e, #9db5f0));
    --phase-command-color: var(--tauline-color-command-phase, light-dark(#a4452c, #f0a58c));
    --table-max-height: 320px;
  }
  .head { display: flex; flex-wrap: wrap; align-items: baseline; gap: 6px 10px; }
  .badge {
    display: inline-flex; align-items: center; gap: 4px; padding: 0 8px; border-radius: 999px;
    border: 1px solid currentColor; font-size: 0.9em; line-height: 1.6;
  }
  .badge.ok { color: var(--margin-color); }
  .badge.bad { color: var(--risk-color); }
  [part~='summary'] { margin: 0; color: var(--muted); }
  .plot-box { cursor: grab; }
  .plot-box.dragging { cursor: grabbing; }
  .tools { display: flex; flex-wrap: wrap; align-items: center; gap: 6px 10px; color: var(--muted); font-size: 0.92em; }
  .tools .hint { flex: 1 1 16em; }
  .table-wrap { max-height: var(--table-max-height); overflow: auto; border-top: 1px solid var(--grid); }
  :host([no-table]) .table-wrap {
    position: absolute; width: 1px; height: 1px; overflow: hidden; clip: rect(0 0 0 0); white-space: nowrap;
  }
  thead th { position: sticky; top: 0; background: var(--surface); z-index: 1; }
  [part~='table'] thead th:last-child { text-align: left; }
  tbody tr { cursor: pointer; }
  tbody tr:hover td, tbody tr:hover th { background: color-mix(in srgb, var(--accent) 7%, transparent); }
  tbody tr[aria-current='true'] td, tbody tr[aria-current='true'] th {
    background: color-mix(in srgb, var(--accent) 16%, transparent);
  }
  .risk { color: var(--risk-color); font-weight: 600; }
  /* Three lines of reason per row; the full text is the cell's title and the live region's. */
  td.reason { text-align: left; white-space: normal; min-width: 16em; color: var(--muted); }
  td.reason span {
    display: -webkit-box; -webkit-box-orient: vertical; -webkit-line-clamp: 3; line-clamp: 3; overflow: hidden;
  }
  .row-button { border: none; padding: 0 2px; text-decoration: underline dotted; }
  .caution {
    margin: 0; padding: 4px 10px; border-left: 3px solid var(--risk-color); color: var(--muted); font-size: 0.92em;
  }
  .swatch.hatch { background: repeating-linear-gradient(135deg, var(--risk-color) 0 2px, transparent 2px 5px); }
  .swatch.setup { background: repeating-linear-gradient(135deg, var(--setup-color) 0 1.5px, transparent 1.5px 4px); }
`;
