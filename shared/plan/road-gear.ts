/**
 * The gear and speed at which a road session holds an engine speed: among the gears whose road
 * speed at that rpm stays within the speed limit, the one closest to a typical speed.
 */
import { roadSpeedKph } from '../physics/road-speed';
import { type GearingSpec, validateGearingSpec } from '../physics/vehicle-spec';

/** A gear (1-based) and the road speed it gives, km/h. */
export interface GearChoice {
  /** Gear, 1-based. */
  readonly gear: number;
  /** Road speed at the rpm in that gear, km/h. */
  readonly speedKph: number;
}

/** Options of {@link gearForRpm}. */
export interface GearChoiceOptions {
  /** Speed never to exceed, km/h. */
  speedLimitKph: number;
  /** Preferred speed, km/h; default 70. */
  typicalSpeedKph?: number;
  /** Slowest speed worth driving at, km/h; default 5. */
  minSpeedKph?: number;
}

/** The gear to hold `rpm` in, or null when every gear needs more than the speed limit. */
export function gearForRpm(
  rpm: number,
  gearing: GearingSpec,
  options: GearChoiceOptions,
): GearChoice | null {
  validateGearingSpec(gearing, 'gearForRpm: gearing');
  if (!(options.speedLimitKph > 0))
    throw new Error('gearForRpm: options.speedLimitKph must be > 0');
  const typical = options.typicalSpeedKph ?? 70;
  const minSpeed = options.minSpeedKph ?? 5;
  let best: GearChoice | null = null;
  gearing.gearRatios.forEach((ratio, i) => {
    const speedKph = roadSpeedKph(rpm, gearing.tireDiameterMm / 1000, ratio, gearing.finalDrive);
    if (speedKph > options.speedLimitKph || speedKph < minSpeed) return;
    if (!best || Math.abs(speedKph - typical) < Math.abs(best.speedKph - typical)) {
      best = { gear: i + 1, speedKph };
    }
  });
  return best;
}
