import { TaulineRateBudget } from './rate-budget.js';

export { TaulineRateBudget };

if (!customElements.get('tauline-rate-budget')) customElements.define('tauline-rate-budget', TaulineRateBudget);

declare global {
  interface HTMLElementTagNameMap {
    'tauline-rate-budget': TaulineRateBudget;
  }
}
