/**
 * Road speed from engine speed and gearing (reference.md §9):
 * v [km/h] = 0.06 · N · π · D / (i_gear · i_final), D the tyre diameter in metres. The factor
 * 0.06 turns metres per minute into km/h. Tyre slip is ignored.
 */
import { requirePositive } from './check-number';

/** Road speed in km/h at `rpm` in a gear of `gearRatio` with `finalDrive`. */
export function roadSpeedKph(
  rpm: number,
  tyreDiameterM: number,
  gearRatio: number,
  finalDrive: number,
): number {
  if (!Number.isFinite(rpm) || rpm < 0) {
    throw new Error(`roadSpeedKph: rpm must be 0 or more (got ${String(rpm)})`);
  }
  requirePositive(tyreDiameterM, 'roadSpeedKph: tyreDiameterM');
  requirePositive(gearRatio, 'roadSpeedKph: gearRatio');
  requirePositive(finalDrive, 'roadSpeedKph: finalDrive');
  return (0.06 * rpm * Math.PI * tyreDiameterM) / (gearRatio * finalDrive);
}

/** Engine speed in rpm at `speedKph` in a gear: the inverse of {@link roadSpeedKph}. */
export function rpmAtSpeed(
  speedKph: number,
  tyreDiameterM: number,
  gearRatio: number,
  finalDrive: number,
): number {
  if (!Number.isFinite(speedKph) || speedKph < 0) {
    throw new Error(`rpmAtSpeed: speedKph must be 0 or more (got ${String(speedKph)})`);
  }
  requirePositive(tyreDiameterM, 'rpmAtSpeed: tyreDiameterM');
  requirePositive(gearRatio, 'rpmAtSpeed: gearRatio');
  requirePositive(finalDrive, 'rpmAtSpeed: finalDrive');
  return (speedKph * gearRatio * finalDrive) / (0.06 * Math.PI * tyreDiameterM);
}

/**
 * Unloaded outer diameter in mm of a tyre marked width/aspect R rim, e.g. 205/55R16:
 * D = 2 · width · aspect / 100 + rim · 25.4.
 */
export function tyreDiameterMm(widthMm: number, aspectPct: number, rimIn: number): number {
  requirePositive(widthMm, 'tyreDiameterMm: widthMm');
  requirePositive(aspectPct, 'tyreDiameterMm: aspectPct');
  requirePositive(rimIn, 'tyreDiameterMm: rimIn');
  return (2 * widthMm * aspectPct) / 100 + rimIn * 25.4;
}
