import { TaulineStabilityPlot } from './stability-plot.js';

export { TaulineStabilityPlot };

if (!customElements.get('tauline-stability-plot'))
  customElements.define('tauline-stability-plot', TaulineStabilityPlot);

declare global {
  interface HTMLElementTagNameMap {
    'tauline-stability-plot': TaulineStabilityPlot;
  }
}
