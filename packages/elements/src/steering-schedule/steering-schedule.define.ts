import { TaulineSteeringSchedule } from './steering-schedule.js';

export { TaulineSteeringSchedule };

if (!customElements.get('tauline-steering-schedule'))
  customElements.define('tauline-steering-schedule', TaulineSteeringSchedule);

declare global {
  interface HTMLElementTagNameMap {
    'tauline-steering-schedule': TaulineSteeringSchedule;
  }
}
