import { css } from 'lit';

/** Styles of `<tauline-steering-schedule>`. */
export const steeringScheduleStyles = css`
  :host {
    --steered-color: var(--tauline-color-steered, light-dark(#1d6b63, #6fd3c4));
    --unsteered-color: var(--tauline-color-unsteered, light-dark(#8a5a86, #d3a2cd));
    --uncertainty-color: var(--tauline-color-uncertainty, var(--steered-color));
    --tolerance-color: var(--tauline-color-tolerance, light-dark(#b7791f, #e0b062));
    --contact-color: var(--tauline-color-contact, light-dark(#56729a, #8ea6cc));
    --maneuver-color: var(--tauline-color-maneuver, light-dark(#b3261e, #f2958e));
    --frequency-command-color: var(--tauline-color-command-frequency, light-dark(#2f4f9e, #9db5f0));
    --phase-command-color: var(--tauline-color-command-phase, light-dark(#a4452c, #f0a58c));
    --plot-height: 340px;
    --table-max-height: 440px;
  }
  .head { display: flex; flex-wrap: wrap; align-items: baseline; gap: 6px 14px; }
  .badge {
    display: inline-flex; align-items: center; gap: 4px; padding: 0 8px; border-radius: 999px;
    border: 1px solid currentColor; font-size: 0.9em; line-height: 1.6;
  }
  .badge.ok { color: var(--steered-color); }
  .badge.bad { color: var(--maneuver-color); }
  [part~='metrics'] { display: flex; flex-wrap: wrap; gap: 2px 16px; margin: 0; color: var(--muted); }
  [part~='metrics'] div { display: flex; gap: 6px; }
  [part~='metrics'] dt::after { content: ':'; }
  [part~='metrics'] dd { margin: 0; color: var(--text); font-variant-numeric: tabular-nums; }
  .plot-box { cursor: grab; }
  .plot-box.dragging { cursor: grabbing; }
  .tools { display: flex; flex-wrap: wrap; align-items: center; gap: 6px 10px; color: var(--muted); font-size: 0.92em; }
  .tools .hint { flex: 1 1 16em; }
  .table-wrap { max-height: var(--table-max-height); overflow: auto; border-top: 1px solid var(--grid); }
  :host([no-table]) .table-wrap {
    position: absolute; width: 1px; height: 1px; overflow: hidden; clip: rect(0 0 0 0); white-space: nowrap;
  }
  thead th { position: sticky; top: 0; background: var(--surface); z-index: 1; }
  tbody tr { cursor: pointer; }
  tbody tr:hover td, tbody tr:hover th { background: color-mix(in srgb, var(--accent) 7%, transparent); }
  tbody tr[aria-current='true'] td, tbody tr[aria-current='true'] th {
    background: color-mix(in srgb, var(--accent) 16%, transparent);
  }
  /* Two lines of reason per row so the scroll box shows about ten commands; the full text is the cell's title and the read-out's. */
  td.reason { text-align: left; white-space: normal; min-width: 14em; color: var(--muted); }
  td.reason span { display: -webkit-box; -webkit-box-orient: vertical; -webkit-line-clamp: 2; line-clamp: 2; overflow: hidden; }
  .invalid-data { min-height: 0; justify-content: flex-start; text-align: left; color: var(--text); }
  .kind { display: inline-flex; align-items: center; gap: 5px; }
  .caution { margin: 0; padding: 4px 10px; border-left: 3px solid var(--tolerance-color); color: var(--muted); font-size: 0.92em; }
  .row-button { border: none; padding: 0 2px; text-decoration: underline dotted; }
`;
