import { TaulineFleetTimeline } from './fleet-timeline.js';

export { TaulineFleetTimeline };

if (!customElements.get('tauline-fleet-timeline')) {
  customElements.define('tauline-fleet-timeline', TaulineFleetTimeline);
}

declare global {
  interface HTMLElementTagNameMap {
    'tauline-fleet-timeline': TaulineFleetTimeline;
  }
}
