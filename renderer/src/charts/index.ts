/** The chart components, in one place so component tests can replace them (jsdom has no canvas). */
import './setup';

export { AcfChart } from './AcfChart';
export { ForecastChart } from './ForecastChart';
export { RootsChart } from './RootsChart';
