/**
 * The cautions shown with every session plan (reference.md §9). The product suggests numbers;
 * people decide.
 */
import { type PlanKind } from './plan-types';

const ROAD: readonly string[] = [
  'Obey the law and the posted speed limits; the plan never asks for more than the limit you set.',
  'Run full load only on a closed course; prefer a dyno for full-load and boosted cells.',
  'A passenger operates the laptop; the driver only drives.',
  'Abort on a lean excursion, knock, or loss of oil or fuel pressure.',
];

const DYNO: readonly string[] = [
  'Secure the vehicle with ratchet straps and wheel chocks before any run.',
  'Keep a suitable (class B) fire extinguisher at hand.',
  'Wear hearing protection: OSHA 29 CFR 1910.95 requires a hearing conservation programme from an 85 dBA 8-hour average.',
  'Run the exhaust extraction: OSHA 29 CFR 1910.1000 limits carbon monoxide to 50 ppm (8-hour average).',
  'Run the cooling fan, and let coolant and intake temperatures return to their start values during cooldowns.',
  'Abort on a lean excursion or loss of oil or fuel pressure.',
];

const COMMON: readonly string[] = [
  'Cellsmith suggests numbers; a qualified person decides what runs on the engine, following local codes, emissions rules and licensed practice.',
];

/** The cautions to show with a plan of `kind`, most specific first. */
export function cautionsFor(kind: PlanKind): readonly string[] {
  if (kind !== 'road' && kind !== 'dyno')
    throw new Error('cautionsFor: kind must be "road" or "dyno"');
  return [...(kind === 'road' ? ROAD : DYNO), ...COMMON];
}
