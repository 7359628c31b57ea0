/**
 * Everything known about one cell, in words: its breakpoints, VE now and what the apply would
 * write there and how (measured, filled, held under load), what the analysis measured there, and the airflow and injector duty the speed-density equation gives
 * at that cell for the vehicle's engine, with the assumptions behind those two figures.
 */
import type { Vehicle } from '@shared/contracts/vehicles';
import type { MixtureDisplay } from '@shared/contracts/preferences';
import { type DutyLevel, assumedPowerLambda, cellPhysics } from '@shared/physics';
import type { AnalysisResource, LeanFlag } from '../../../core/api/analyses-api';
import { LEAN_SEVERITY } from '../analysis/analysis-text';
import { ORIGIN_LABEL } from '../grid/overlays';
import type { PreviewResult } from '../preview/proposal-preview-compute';
import { type CellRef, NO_FIGURE, grouped, lambdaErrorText, signed } from './plot-format';

/** Intake air temperature the physics assumes, °C: the ECU's own air charge is not logged here. */
export const ASSUMED_IAT_C = 25;

/** What the cell detail is computed from. */
export interface CellDetailInput {
  /** RPM breakpoints, ascending. */
  readonly rpmAxis: readonly number[];
  /** MAP breakpoints in kPa, ascending. */
  readonly mapAxisKpa: readonly number[];
  /** VE now (with unsaved edits), `[row][col]`. */
  readonly values: readonly (readonly number[])[];
  /** VE of the revision the analysis ran on (the saved head before one runs), to tell a change. */
  readonly baseValues: readonly (readonly number[])[];
  /** The analysis, if any. */
  readonly analysis: AnalysisResource | null;
  /**
   * The live preview of applying the analysis: what the apply would write at the cell and how
   * (measured, filled, held). Absent or null: those lines wait for it.
   */
  readonly preview?: PreviewResult | null;
  /** The vehicle, for its engine (null while loading). */
  readonly vehicle: Pick<Vehicle, 'engine'> | null;
  /** The cell. */
  readonly cell: CellRef;
  /** How the user reads mixture: lambda (default) or AFR with the vehicle's stoichiometric AFR. */
  readonly mixture?: MixtureDisplay;
}

/** One line of the detail: a label and its figure. */
export interface DetailLine {
  /** What the line tells. */
  readonly label: string;
  /** The figure in words. */
  readonly value: string;
  /**
   * `lean` for a lean-under-load flag with enough data, `watch` for one on too little data,
   * `held` for a cell the fuel-safety guard holds, `warn` for injector duty near its limit.
   */
  readonly tone: 'lean' | 'watch' | 'held' | 'warn' | null;
}

/** The airflow and duty at the cell, and the lambda they assumed. */
export interface CellPhysicsFigures {
  /** Air mass flow, g/s. */
  readonly airflowGps: number;
  /** Injector duty, % of the engine cycle. */
  readonly dutyPct: number;
  /** How close the duty is to the injector's limit. */
  readonly level: DutyLevel;
  /** The commanded lambda used for the fuel. */
  readonly lambda: number;
  /** Where that lambda came from. */
  readonly lambdaSource: 'logged' | 'assumed';
}

/** The detail of one cell. */
export interface CellDetail {
  /** Heading: the breakpoints. */
  readonly title: string;
  /** Where the cell sits in the table, counted from 1. */
  readonly subtitle: string;
  /** The lines, in order. */
  readonly lines: readonly DetailLine[];
  /** The physics figures, null without a vehicle. */
  readonly physics: CellPhysicsFigures | null;
  /** The assumptions behind airflow and duty, in one paragraph. */
  readonly assumptions: string;
}

const STATUS_TEXT: Readonly<Record<string, string>> = {
  trusted: 'Trusted: enough data for a proposal',
  too_little_data: 'Too little data for a proposal',
  locked: 'Locked',
  no_data: 'No data',
};

function line(label: string, value: string, tone: DetailLine['tone'] = null): DetailLine {
  return { label, value, tone };
}

function fixed(value: number | null | undefined, digits: number, unit = ''): string {
  return value === null || value === undefined || !Number.isFinite(value)
    ? NO_FIGURE
    : `${value.toFixed(digits)}${unit}`;
}

/** A lean flag's line: its severity's word in the label, the figures and what to do. */
function flagLine(flag: LeanFlag): DetailLine {
  const { word, action } = LEAN_SEVERITY[flag.severity];
  const worst = flag.worstLeanPercent === null ? '' : `, worst ${signed(flag.worstLeanPercent)} %`;
  const figures = `${signed(flag.leanPercent)} % leaner than commanded${worst}`;
  return flag.severity === 'watch'
    ? line(`Looks lean under load (${word})`, `${figures} — ${action}`, 'watch')
    : line(`Lean under load (${word})`, `${figures} — ${action}`, 'lean');
}

/** Why a held cell keeps its value, with the guard's figures. */
function heldText(preview: PreviewResult): string {
  const guard = preview.guard;
  const figures = guard
    ? ` at or above the load line (${Number(guard.loadLineKpa.toFixed(1))} kPa), a guess from ` +
      `the neighbours would have made this cell more than ` +
      `${Number((guard.leanAllowance * 100).toFixed(2))} % leaner`
    : ' a guess from the neighbours would have made this cell leaner under load';
  return `Needs data:${figures}, so the apply keeps its value. Log this cell to correct it.`;
}

/**
 * Airflow and injector duty at the cell from `cellPhysics` (shared/physics) over VE now. The
 * fuel is for the lambda the logs commanded at this cell when the analysis has one, else for
 * the product's assumed target (λ 1 up to 80 kPa, richer to 0.80 at 100 kPa and above).
 */
export function physicsAt(input: CellDetailInput): CellPhysicsFigures | null {
  if (!input.vehicle) return null;
  const { row, col } = input.cell;
  const rpm = input.rpmAxis[col];
  const mapKpa = input.mapAxisKpa[row];
  const logged = input.analysis?.cells[row]?.[col]?.lambdaCommanded ?? null;
  const lambda = logged !== null && logged > 0 ? logged : assumedPowerLambda(rpm, mapKpa);
  const physics = cellPhysics(
    { rpmAxis: input.rpmAxis, mapAxisKpa: input.mapAxisKpa, values: input.values },
    input.vehicle.engine,
    {
      iatC: ASSUMED_IAT_C,
      lambdaCmd: (r, m) => (r === rpm && m === mapKpa ? lambda : assumedPowerLambda(r, m)),
    },
  );
  const i = row * input.rpmAxis.length + col;
  return {
    airflowGps: physics.airflowGps.data[i],
    dutyPct: physics.dutyPct.data[i],
    level: physics.levels[row][col],
    lambda,
    lambdaSource: logged !== null && logged > 0 ? 'logged' : 'assumed',
  };
}

/** The assumptions behind the physics lines. */
function assumptionsText(input: CellDetailInput, physics: CellPhysicsFigures | null): string {
  if (!physics || !input.vehicle) {
    return 'Airflow and injector duty appear once the vehicle’s engine is known.';
  }
  const { engine } = input.vehicle;
  const lambda =
    physics.lambdaSource === 'logged'
      ? `λ ${physics.lambda.toFixed(3)} as commanded in the logs at this cell`
      : `λ ${physics.lambda.toFixed(2)} assumed (1.00 up to 80 kPa, richer to 0.80 at 100 kPa)`;
  return (
    `Speed density with VE now, intake air ${ASSUMED_IAT_C} °C, ${lambda}; ` +
    `${engine.displacementL} L, ${engine.cylinders} cylinders, ${engine.fuel} ` +
    `(stoichiometric AFR ${engine.stoichAfr}), ${grouped(engine.injectorCcMin)} cc/min injectors ` +
    'at rated pressure, no dead time: the duty is a lower bound.'
  );
}

/** The detail of one cell. */
export function cellDetail(input: CellDetailInput): CellDetail {
  const stoichAfr = input.vehicle?.engine.stoichAfr;
  // AFR needs the fuel's stoichiometric ratio; without the vehicle, lambda is shown.
  const isAfr = input.mixture === 'afr' && stoichAfr !== undefined;
  const mixtureText = (lambda: number): string =>
    isAfr ? (lambda * (stoichAfr as number)).toFixed(2) : lambda.toFixed(3);
  const { row, col } = input.cell;
  const rpm = input.rpmAxis[col];
  const mapKpa = input.mapAxisKpa[row];
  const ve = input.values[row]?.[col];
  const saved = input.baseValues[row]?.[col];
  const cell = input.analysis?.cells[row]?.[col] ?? null;
  const preview = input.analysis ? (input.preview ?? null) : null;
  const applied = preview?.values[row]?.[col] ?? null;
  const origin = preview?.origin[row]?.[col] ?? null;
  const flag = input.analysis?.leanFlags.find((f) => f.row === row && f.col === col);
  const physics = physicsAt(input);

  const veText =
    saved !== undefined && ve !== saved
      ? `${fixed(ve, 1, ' %')} (analysed revision ${fixed(saved, 1, ' %')})`
      : fixed(ve, 1, ' %');
  const lines: DetailLine[] = [line('VE now', veText)];
  if (input.analysis) {
    // What the apply would write, against the analysed revision (as the change overlay).
    const change =
      applied !== null && saved !== undefined && saved !== 0 ? (applied / saved - 1) * 100 : null;
    // The spread of the correction ratio, shown in percent of it.
    const spread = cell?.spread ?? null;
    lines.push(
      line('Apply writes', fixed(applied, 1, ' %')),
      line('Change', change === null ? NO_FIGURE : `${signed(change)} %`),
      line('How', origin === null ? NO_FIGURE : ORIGIN_LABEL[origin]),
    );
    if (origin === 'held' && preview)
      lines.push(line('Held under load', heldText(preview), 'held'));
    lines.push(
      line('Samples', cell ? grouped(cell.samples) : NO_FIGURE),
      line('Weight', fixed(cell?.weight, 1)),
      line('Effective count', fixed(cell?.effectiveCount, 1)),
      line('Spread', spread === null ? NO_FIGURE : `${(spread * 100).toFixed(1)} %`),
      line(
        isAfr ? 'AFR' : 'Lambda',
        !cell || cell.lambdaMeasured === null || cell.lambdaCommanded === null
          ? NO_FIGURE
          : `${mixtureText(cell.lambdaMeasured)} measured vs ` +
              `${mixtureText(cell.lambdaCommanded)} commanded` +
              (cell.lambdaErrorPct === null ? '' : ` (${lambdaErrorText(cell.lambdaErrorPct)})`),
      ),
      line('Status', STATUS_TEXT[cell?.status ?? 'no_data'] ?? cell?.status ?? NO_FIGURE),
    );
    if (flag) lines.push(flagLine(flag));
  }
  if (physics) {
    const near = physics.level === 'ok' ? '' : ' — near the injector’s limit';
    lines.push(
      line('Airflow', `${physics.airflowGps.toFixed(1)} g/s`),
      line(
        'Injector duty',
        `${physics.dutyPct.toFixed(1)} %${near}`,
        physics.level === 'ok' ? null : 'warn',
      ),
    );
  }
  return {
    title: `${grouped(rpm)} rpm · ${mapKpa} kPa`,
    subtitle: `Row ${row + 1} (MAP), column ${col + 1} (RPM)`,
    lines,
    physics,
    assumptions: assumptionsText(input, physics),
  };
}
