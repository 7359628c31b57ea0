/**
 * What a driver (on the road) or an operator (on the dyno) sets in each time step, and what of
 * the engine's state they get to react to.
 */

/** The mechanical operating point of one time step. */
export interface OperatingPoint {
  /** Engine speed, rpm. */
  readonly rpm: number;
  /** Throttle, %. */
  readonly tpsPct: number;
  /** Engaged gear, 1-based; 0 while the clutch is open or in neutral. */
  readonly gear: number;
  /** Vehicle (or roller) speed, km/h. */
  readonly speedKph: number;
  /** Air speed over the intercooler and radiator, km/h (a dyno fan counts). */
  readonly coolingAirKph: number;
}

/** The engine state a driver reacts to. */
export interface EngineState {
  /** Manifold pressure, kPa absolute. */
  readonly mapKpa: number;
  /** Intake air temperature, °C. */
  readonly iatC: number;
  /** Coolant temperature, °C. */
  readonly ectC: number;
  /** Barometric pressure, kPa. */
  readonly baroKpa: number;
  /** Whether the ECU is cutting fuel. */
  readonly isFuelCut: boolean;
}

/** A driver or dyno operator: advances one time step and sets the operating point. */
export interface SimDriver {
  /** Advances `dtS` seconds. */
  step(dtS: number, engine: EngineState): OperatingPoint;
}
