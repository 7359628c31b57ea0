/**
 * The simulated ECU: speed-density fuelling from its (wrong) VE table, a commanded-lambda table,
 * closed-loop trims at light load, open loop under load, tip-in and warm-up enrichment and fuel
 * cut on overrun. Only the trims it applies are logged, and they are 0 in open loop, so the
 * correction VE_new = VE_old · (λ_meas/λ_cmd) · (1 + STFT)(1 + LTFT) holds for every sample
 * outside the transients the filters remove (reference.md §2).
 */
import { type VeTable } from '../core/table';
import { airMassPerEventMg } from '../physics/air-mass';
import { FUEL_DENSITY_GCC, fuelPerEventMg, injectorDutyPct } from '../physics/injector-duty';
import { type SeededRandom } from './seeded-random';
import { type SimVehicle } from './sim-vehicle';
import { type LambdaTargetTable, lookupBilinear } from './ve-surface';

/** What the ECU sees in one time step. */
export interface EcuInput {
  /** Time step, s. */
  readonly dtS: number;
  /** Engine speed, rpm. */
  readonly rpm: number;
  /** Manifold pressure, kPa absolute. */
  readonly mapKpa: number;
  /** Intake air temperature, °C. */
  readonly iatC: number;
  /** Coolant temperature, °C. */
  readonly ectC: number;
  /** Throttle, %. */
  readonly tpsPct: number;
  /** The wideband's latest reading (what the closed loop acts on). */
  readonly lambdaMeasured: number;
}

/** What the ECU does in one time step. */
export interface EcuOutput {
  /** VE the ECU looked up, percent. */
  readonly veEcuPct: number;
  /** Commanded lambda. */
  readonly lambdaTarget: number;
  /** Whether the mixture loop is closed. */
  readonly isClosedLoop: boolean;
  /** Whether fuel is cut (overrun). */
  readonly isFuelCut: boolean;
  /** Short-term trim applied, %. */
  readonly stftPct: number;
  /** Long-term trim applied, %. */
  readonly ltftPct: number;
  /** Extra fuel factor from warm-up and tip-in enrichment (1 = none). */
  readonly enrichment: number;
  /** Fuel injected per intake event, mg. */
  readonly fuelMgPerEvent: number;
  /** Injector duty, %. */
  readonly injDutyPct: number;
}

/** The ECU's behaviour constants; all common practice, no published source. */
const FUEL_CUT_ENTRY_RPM = 1500;
const FUEL_CUT_EXIT_RPM = 1150;
const FUEL_CUT_DELAY_S = 0.8;
const CLOSED_LOOP_MIN_ECT_C = 65;
const CLOSED_LOOP_DELAY_S = 2;
const STFT_GAIN_PER_S = 0.5;
const LTFT_TIME_S = 40;
const TRIM_LIMIT = 0.25;
const TIP_IN_THRESHOLD_PCT_S = 40;
const TIP_IN_DECAY_S = 0.4;

/** A stateful ECU; `step` advances it one sample. */
export interface SimEcu {
  /** Advances one time step. */
  step(input: EcuInput): EcuOutput;
}

/** Creates the ECU of `vehicle` running `veTable` and `lambdaTable`. */
export function createSimEcu(
  vehicle: SimVehicle,
  veTable: VeTable,
  lambdaTable: LambdaTargetTable,
  random: SeededRandom,
): SimEcu {
  const { engine } = vehicle;
  const density =
    engine.fuel === 'custom' ? FUEL_DENSITY_GCC.gasoline : FUEL_DENSITY_GCC[engine.fuel];
  let stftIntegral = 0;
  let ltft = 0;
  let tipIn = 0;
  let lastTps = Number.NaN;
  let closedThrottleS = 0;
  let isFuelCut = false;
  let closedLoopReadyS = 0;
  return {
    step(input) {
      const { dtS, rpm, mapKpa, iatC, ectC, tpsPct } = input;
      const veEcuPct = lookupBilinear(veTable, rpm, mapKpa);
      const lambdaTarget = lookupBilinear(lambdaTable, rpm, mapKpa);

      // Tip-in: a fast throttle opening wets the port walls; add fuel that decays away.
      const tpsRate = Number.isNaN(lastTps) ? 0 : (tpsPct - lastTps) / dtS;
      lastTps = tpsPct;
      tipIn *= Math.exp(-dtS / TIP_IN_DECAY_S);
      if (tpsRate > TIP_IN_THRESHOLD_PCT_S) {
        tipIn = Math.max(tipIn, Math.min(0.35, 0.0012 * (tpsRate - TIP_IN_THRESHOLD_PCT_S)));
      }

      // Overrun fuel cut after a short closed-throttle delay, with hysteresis on speed.
      closedThrottleS = tpsPct < 1 ? closedThrottleS + dtS : 0;
      if (isFuelCut) {
        isFuelCut = tpsPct < 1 && rpm > FUEL_CUT_EXIT_RPM;
      } else {
        isFuelCut = closedThrottleS >= FUEL_CUT_DELAY_S && rpm > FUEL_CUT_ENTRY_RPM && ectC > 40;
      }

      const canClose =
        ectC >= CLOSED_LOOP_MIN_ECT_C && lambdaTarget >= 0.995 && !isFuelCut && tipIn < 0.01;
      closedLoopReadyS = canClose ? closedLoopReadyS + dtS : 0;
      const isClosedLoop = closedLoopReadyS >= CLOSED_LOOP_DELAY_S;

      let stft = 0;
      let ltftApplied = 0;
      if (isClosedLoop) {
        const error = input.lambdaMeasured / lambdaTarget - 1;
        stftIntegral += STFT_GAIN_PER_S * error * dtS;
        // The long-term trim slowly takes over what the short-term trim keeps holding.
        const moved = (stftIntegral * dtS) / LTFT_TIME_S;
        ltft = Math.max(-TRIM_LIMIT, Math.min(TRIM_LIMIT, ltft + moved));
        stftIntegral = Math.max(-TRIM_LIMIT, Math.min(TRIM_LIMIT, stftIntegral - moved));
        stft = stftIntegral + 0.006 * random.normal();
        ltftApplied = ltft;
      } else {
        stftIntegral = 0;
      }

      const warmUp = 0.25 * Math.min(1, Math.max(0, (70 - ectC) / 60));
      const enrichment = (1 + warmUp) * (1 + tipIn);
      const airMg = airMassPerEventMg(
        veEcuPct / 100,
        mapKpa,
        iatC,
        engine.displacementL,
        engine.cylinders,
      );
      const fuelMgPerEvent = isFuelCut
        ? 0
        : fuelPerEventMg(airMg, lambdaTarget, engine.stoichAfr) *
          (1 + stft) *
          (1 + ltftApplied) *
          enrichment;
      return {
        veEcuPct,
        lambdaTarget,
        isClosedLoop,
        isFuelCut,
        stftPct: 100 * stft,
        ltftPct: 100 * ltftApplied,
        enrichment,
        fuelMgPerEvent,
        injDutyPct: injectorDutyPct(fuelMgPerEvent, rpm, engine.injectorCcMin, density),
      };
    },
  };
}
