import { TaulineReviewFindings } from './review-findings.js';

export { TaulineReviewFindings };

if (!customElements.get('tauline-review-findings'))
  customElements.define('tauline-review-findings', TaulineReviewFindings);

declare global {
  interface HTMLElementTagNameMap {
    'tauline-review-findings': TaulineReviewFindings;
  }
}
