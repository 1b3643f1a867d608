/**
 * The method for an intermittent or lumpy item: SBA (Syntetos & Boylan 2005) or TSB (Teunter,
 * Syntetos & Babai 2011), each with its smoothing constants chosen by its own in-sample one-step
 * mean squared error, and the one with the smaller one-step mean squared error kept. Both are
 * warmed up to the same week (the first demand), so their errors cover the same weeks. A tie goes
 * to SBA, the older and simpler method.
 */
import { fitSba, type SbaState } from './sba';
import { fitTsb } from './tsb';

export function fitSparseDemand(y: ArrayLike<number>): { chosen: SbaState; sba: SbaState; tsb: SbaState } {
  const sba = fitSba(y);
  const tsb = fitTsb(y);
  return { chosen: tsb.errorVariance < sba.errorVariance ? tsb : sba, sba, tsb };
}
