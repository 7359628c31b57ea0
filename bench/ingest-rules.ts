import type { FilterRule } from '../shared/filter';

/**
 * The filter of the ingest benchmark: the same rules, thresholds and order as its Python peer
 * (bench/peer/ingest_peer.py), with no settle times since the peer has none.
 */
export const BENCH_FILTER_RULES: readonly FilterRule[] = [
  { kind: 'warmUp', minEctC: 70 },
  { kind: 'fuelCut', settleS: 0 },
  { kind: 'tipIn', maxTpsRatePctPerS: 10, settleS: 0 },
  { kind: 'rpmRate', maxRpmPerS: 300 },
  { kind: 'mapRate', maxKpaPerS: 20 },
  { kind: 'lambdaRange', min: 0.65, max: 1.3 },
];
