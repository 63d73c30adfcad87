/**
 * Shared styles: the two-level theme (page-level `--tauline-*` tokens, component-level
 * custom properties on `:host` falling back to them), light and dark defaults through
 * `light-dark()`, empty/error states and the accessible table. Nothing leaks out of the
 * shadow roots; nothing global is read except the inherited `--tauline-*` tokens.
 *
 * @module
 */
import { css } from 'lit';

/** Base host styles and the common custom properties every element accepts. */
export const baseStyles = css`
  :host {
    --surface: var(--tauline-color-surface, light-dark(#fcfbf8, #15181e));
    --text: var(--tauline-color-text, light-dark(#1c2230, #e4e2dc));
    --muted: var(--tauline-color-muted, light-dark(#5b6373, #9aa1ad));
    --grid: var(--tauline-color-grid, light-dark(#e7e3da, #272c35));
    --border: var(--tauline-color-border, light-dark(#d6d1c4, #353b46));
    --accent: var(--tauline-color-accent, light-dark(#2f5d9e, #8fb4ec));
    --font-family: var(--tauline-font-family, ui-sans-serif, system-ui, 'Segoe UI', Roboto, sans-serif);
    --font-size: var(--tauline-font-size, 13px);
    --radius: var(--tauline-radius, 6px);
    display: block;
    box-sizing: border-box;
    color: var(--text);
    background: var(--surface);
    font-family: var(--font-family);
    font-size: var(--font-size);
    line-height: 1.4;
    border-radius: var(--radius);
    contain: content;
  }
  :host([hidden]) { display: none; }
  :host([theme='light']) { color-scheme: light; }
  :host([theme='dark']) { color-scheme: dark; }
  *, *::before, *::after { box-sizing: inherit; }
  [part~='base'] { display: flex; flex-direction: column; gap: 8px; padding: 10px 12px; }
  .title { margin: 0; font-size: 1em; font-weight: 600; }
  .state {
    display: flex; align-items: center; justify-content: center; min-height: 120px;
    padding: 16px; border: 1px dashed var(--border); border-radius: var(--radius);
    color: var(--muted); text-align: center;
  }
  .state.error { border-style: solid; border-color: var(--tauline-color-fail, light-dark(#b3261e, #f2958e)); }
  .sr-only {
    position: absolute; width: 1px; height: 1px; padding: 0; margin: -1px; overflow: hidden;
    clip: rect(0 0 0 0); white-space: nowrap; border: 0;
  }
  .probe { position: absolute; width: 0; height: 0; overflow: hidden; visibility: hidden; }
  table { border-collapse: collapse; width: 100%; font-variant-numeric: tabular-nums; }
  caption { text-align: left; color: var(--muted); padding: 0 0 4px; caption-side: top; }
  th, td { padding: 3px 8px; border-bottom: 1px solid var(--grid); text-align: right; white-space: nowrap; }
  th:first-child, td:first-child { text-align: left; }
  thead th { color: var(--muted); font-weight: 600; border-bottom-color: var(--border); }
  :focus-visible { outline: 2px solid var(--accent); outline-offset: 2px; }
  button {
    font: inherit; color: inherit; background: transparent; border: 1px solid var(--border);
    border-radius: calc(var(--radius) - 2px); padding: 2px 8px; cursor: pointer;
  }
  button:hover { border-color: var(--accent); }
`;

/** Styles for canvas plots: a positioned box holding the data canvas, the overlay and the tooltip. */
export const plotStyles = css`
  .plot-box { position: relative; width: 100%; height: var(--plot-height, 320px); touch-action: none; }
  .plot-box canvas { position: absolute; inset: 0; display: block; }
  .plot-box:focus-visible { outline: 2px solid var(--accent); outline-offset: 2px; border-radius: 2px; }
  [part~='tooltip'] {
    position: absolute; pointer-events: none; z-index: 2; min-width: 10em; max-width: 22em;
    padding: 6px 8px; border: 1px solid var(--border); border-radius: var(--radius);
    background: var(--surface); color: var(--text); box-shadow: 0 2px 8px light-dark(#0002, #0008);
    font-variant-numeric: tabular-nums; white-space: nowrap; width: max-content;
  }
  [part~='tooltip'] .note { white-space: normal; margin-top: 4px; color: var(--muted); }
  [part~='tooltip'] dl { display: grid; grid-template-columns: auto auto; gap: 1px 10px; margin: 0; }
  [part~='tooltip'] dt { color: var(--muted); }
  [part~='tooltip'] dd { margin: 0; text-align: right; }
  [part~='legend'] { display: flex; flex-wrap: wrap; gap: 4px 14px; margin: 0; padding: 0; list-style: none; color: var(--muted); }
  [part~='legend'] li { display: inline-flex; align-items: center; gap: 6px; }
  .swatch { display: inline-block; width: 18px; height: 10px; }
  .swatch svg { display: block; overflow: visible; }
`;
