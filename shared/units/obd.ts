/**
 * Scalings of the standard on-board-diagnostics parameters a logger may record as raw bytes
 * (A, B, C, D are the data bytes in the order the vehicle sends them). The values these give
 * for wideband and commanded mixture are lambda, even where the standard's text calls them an
 * equivalence ratio: its own example multiplies the stoichiometric AFR by the value.
 */

function checkByte(value: number, name: string): number {
  if (!Number.isInteger(value) || value < 0 || value > 255) {
    throw new Error(`${name} must be a byte (an integer 0–255)`);
  }
  return value;
}

/** Engine coolant or intake air temperature, °C: A − 40. */
export function obdTemperatureC(a: number): number {
  return checkByte(a, 'a') - 40;
}

/** Short- or long-term fuel trim, %: (A − 128) · 100/128 (positive: the ECU adds fuel). */
export function obdFuelTrimPct(a: number): number {
  return ((checkByte(a, 'a') - 128) * 100) / 128;
}

/** Manifold absolute pressure, kPa: A (so it saturates at 255 kPa). */
export function obdMapKpa(a: number): number {
  return checkByte(a, 'a');
}

/** Engine speed, rpm: (256A + B) / 4. */
export function obdRpm(a: number, b: number): number {
  return (256 * checkByte(a, 'a') + checkByte(b, 'b')) / 4;
}

/** Throttle position, %: 100A / 255. */
export function obdThrottlePct(a: number): number {
  return (100 * checkByte(a, 'a')) / 255;
}

/** Wideband or commanded lambda from bytes A, B: 2/65536 · (256A + B), range 0 to < 2. */
export function obdLambda(a: number, b: number): number {
  return (2 / 65536) * (256 * checkByte(a, 'a') + checkByte(b, 'b'));
}

/** Wideband sensor voltage from bytes C, D: 8/65536 · (256C + D), V. */
export function obdWidebandVolts(c: number, d: number): number {
  return (8 / 65536) * (256 * checkByte(c, 'c') + checkByte(d, 'd'));
}

/** Wideband sensor current from bytes C, D: (256C + D)/256 − 128, mA. */
export function obdWidebandMilliamps(c: number, d: number): number {
  return (256 * checkByte(c, 'c') + checkByte(d, 'd')) / 256 - 128;
}

/** What the fuel-system status byte says about the loop and fuel cut. */
export interface ObdFuelSystemStatus {
  /** Whether fuelling is closed loop (on the oxygen sensor). */
  readonly closedLoop: boolean;
  /** Whether the ECU is in open loop for load or deceleration fuel cut. */
  readonly openLoopLoadOrCut: boolean;
  /** Whether the engine is cold (open loop, not yet warm). */
  readonly cold: boolean;
  /** Whether a fault forces open loop or taints closed loop. */
  readonly fault: boolean;
}

/**
 * Decodes the fuel-system status byte: 1 open loop (cold), 2 closed loop, 4 open loop for load
 * or deceleration fuel cut, 8 open loop from a fault, 16 closed loop with a fault.
 */
export function obdFuelSystemStatus(a: number): ObdFuelSystemStatus {
  const value = checkByte(a, 'a');
  return {
    cold: value === 1,
    closedLoop: value === 2 || value === 16,
    openLoopLoadOrCut: value === 4,
    fault: value === 8 || value === 16,
  };
}
