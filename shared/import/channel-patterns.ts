import type { Channel } from '../core/channels';
import type { PressureReference } from './parse-unit-text';

/**
 * One way a column name can say which channel it holds. Names are matched after
 * {@link normaliseColumnName}: lower case, words split on anything that is not a letter or digit,
 * the bracketed unit removed (`Intake Air Temp [F]` → `intake air temp`, `map_kpa` → `map kpa`).
 */
export interface ChannelPattern {
  /** The channel the column holds when the pattern matches. */
  readonly channel: Channel;
  /** Must match the normalised name. */
  readonly match: RegExp;
  /** Must not match the normalised name. */
  readonly exclude?: RegExp;
  /** How sure a match is, 0–1: exact trade abbreviations score high, lone generic words lower. */
  readonly strength: number;
  /** For pressures: the reference the unit text must state for this pattern to apply. */
  readonly requires?: Exclude<PressureReference, null>;
}

// Words that turn a mixture, RPM or throttle column into a commanded value, not a measured one.
const COMMANDED = String.raw`(target|tgt|cmd|commanded|command|desired|requested|req|setpoint|aim|goal)`;
const MIXTURE = String.raw`(lambda|lam|afr|air fuel|a f|phi|equivalence( ratio)?|eq ratio|mixture|wideband|wb|uego|wbo2)`;
const NOT_A_READING =
  /\b(volt|volts|voltage|v|heater|status|trim|error|delta|diff|corr|correction|temp|current|ma|ready)\b/;

/**
 * The column-name patterns, one table for all channels and naming styles: snake_case with unit
 * suffixes, words with units in brackets, and short capitals with a units row.
 */
export const CHANNEL_PATTERNS: readonly ChannelPattern[] = [
  {
    channel: 'time',
    match:
      /^(time|t|timestamp|elapsed|elapsed time|log time|time stamp)( s| ms| sec| secs| seconds)?$/,
    strength: 1,
  },
  {
    channel: 'time',
    match: /\b(time|timestamp|elapsed)\b/,
    exclude: /\b(inj|injector|pulse|ignition|spark|dwell|open|on|since|run|date|clock)\b/,
    strength: 0.7,
  },
  {
    channel: 'rpm',
    match: /^(rpm|engine rpm|eng rpm|engine speed|eng speed|motor speed|revs|tach|tacho)( rpm)?$/,
    strength: 1,
  },
  {
    channel: 'rpm',
    match: /\b(rpm|engine speed|eng speed)\b/,
    exclude: new RegExp(String.raw`\b(${COMMANDED}|idle|limit|max|min|delta|rate)\b`),
    strength: 0.75,
  },
  {
    channel: 'map',
    match:
      /^(map|manifold (absolute )?pressure|manifold press|man press|intake manifold pressure|map sensor)( kpa| psi| bar| psia| bara| kpaa)?$/,
    strength: 1,
  },
  {
    channel: 'map',
    match: /\b(map|manifold|intake pressure|boost pressure abs)\b/,
    exclude: new RegExp(
      String.raw`\b(baro|vacuum|${COMMANDED}|limit|volt|v|voltage|error|mat|temp)\b`,
    ),
    strength: 0.7,
  },
  {
    channel: 'map',
    match: /\bboost\b/,
    exclude: /\b(target|duty|control|solenoid|limit|cut)\b/,
    strength: 0.8,
    requires: 'absolute',
  },
  {
    channel: 'boost',
    match: /^(boost|boost pressure|manifold boost)( kpa| psi| bar| psig| barg| kpag)?$/,
    strength: 1,
  },
  {
    channel: 'boost',
    match: /\bboost\b/,
    exclude: new RegExp(
      String.raw`\b(${COMMANDED}|duty|control|solenoid|limit|cut|wastegate|wg)\b`,
    ),
    strength: 0.75,
  },
  { channel: 'boost', match: /\b(map|manifold pressure)\b/, strength: 0.8, requires: 'gauge' },
  {
    channel: 'baro',
    match:
      /\b(baro|barometer|barometric|barometric pressure|ambient pressure|atmospheric pressure|atm pressure)\b/,
    exclude: /\b(volt|v|voltage)\b/,
    strength: 1,
  },
  {
    channel: 'lambdaTarget',
    match: new RegExp(String.raw`^(?=.*\b${COMMANDED}\b)(?=.*\b${MIXTURE}\b)`),
    exclude: NOT_A_READING,
    strength: 1,
  },
  {
    channel: 'lambda',
    match: new RegExp(
      String.raw`^(lambda|lambda measured|measured lambda|afr|air fuel|wideband|lambda 1|lambda1|wb lambda|wb afr|afr measured|measured afr|phi|phi measured)( lambda| afr| phi)?$`,
    ),
    strength: 1,
  },
  {
    channel: 'lambda',
    match: new RegExp(String.raw`\b${MIXTURE}\b`),
    exclude: new RegExp(String.raw`\b${COMMANDED}\b|${NOT_A_READING.source}`),
    strength: 0.8,
  },
  {
    channel: 'iat',
    match:
      /^(iat|intake air temp|intake air temperature|air temp|mat|manifold air temp|charge temp|inlet air temp|intake temp|act)( c| f| k)?$/,
    strength: 1,
  },
  {
    channel: 'iat',
    match: /\b(iat|intake air|air temp|charge air|inlet air|manifold air)\b/,
    exclude: /\b(volt|v|voltage|raw|fuel|oil|coolant|exhaust)\b/,
    strength: 0.75,
  },
  {
    channel: 'ect',
    match:
      /^(ect|clt|coolant|coolant temp|coolant temperature|engine temp|water temp|engine coolant temp)( c| f| k)?$/,
    strength: 1,
  },
  {
    channel: 'ect',
    match: /\b(ect|clt|coolant|water temp)\b/,
    exclude: /\b(volt|v|voltage|raw|fan|level|pressure)\b/,
    strength: 0.75,
  },
  {
    channel: 'tps',
    match: /^(tps|throttle|throttle position|throttle pos|tp|throttle angle)( pct)?$/,
    strength: 1,
  },
  {
    channel: 'tps',
    match: /\b(tps|throttle)\b/,
    exclude: new RegExp(String.raw`\b(${COMMANDED}|volt|v|voltage|raw|rate|delta|body|motor)\b`),
    strength: 0.75,
  },
  {
    channel: 'stft',
    match:
      /\b(stft|short term fuel trim|short term trim|short fuel trim|short trim|st trim|st fuel trim|fuel trim short)\b/,
    strength: 1,
  },
  {
    channel: 'ltft',
    match:
      /\b(ltft|long term fuel trim|long term trim|long fuel trim|long trim|lt trim|lt fuel trim|fuel trim long)\b/,
    strength: 1,
  },
  {
    channel: 'closedLoop',
    match:
      /^(cl|closed loop|loop|loop status|closed loop status|cl status|cl active|closed loop active|loop mode|fuel loop)$/,
    strength: 1,
  },
  {
    channel: 'closedLoop',
    match: /\b(closed loop|cl active|loop)\b/,
    exclude: /\b(fuel cut|open loop only|time|count)\b/,
    strength: 0.7,
  },
  {
    channel: 'fuelCut',
    match:
      /\b(dfco|fuel cut|fuelcut|decel fuel cut|decel cut|overrun cut|overrun fuel cut|fuel cutoff|fuel shutoff)\b/,
    exclude: /\b(count|rpm|limit)\b/,
    strength: 1,
  },
  {
    channel: 'gear',
    match: /^(gear|current gear|gear position|selected gear|engaged gear|gear engaged)$/,
    strength: 1,
  },
  { channel: 'gear', match: /\bgear\b/, exclude: /\b(ratio|oil|temp|shift|time)\b/, strength: 0.7 },
  {
    channel: 'speed',
    match:
      /^(speed|vehicle speed|vss|road speed|veh speed|car speed|ground speed|wheel speed)( kph| kmh| mph)?$/,
    strength: 1,
  },
  {
    channel: 'speed',
    match: /\b(vehicle speed|vss|road speed|speed)\b/,
    exclude: /\b(engine|eng|motor|fan|idle|shaft|turbo|pump|limit|target|wind)\b/,
    strength: 0.7,
  },
  {
    channel: 'knock',
    match:
      /\b(knock retard|knock correction|knock deg|knock|kr|ign retard|spark retard|timing retard)\b/,
    exclude: /\b(count|sensor|volt|v|voltage|level|noise|threshold|window|events?)\b/,
    strength: 0.9,
  },
  {
    channel: 'injDuty',
    match:
      /\b(inj duty|injector duty|inj duty cycle|injector duty cycle|inj dc|injector dc|idc|fuel duty)\b/,
    strength: 1,
  },
  {
    channel: 'injDuty',
    match: /\bduty\b/,
    exclude: /\b(boost|wastegate|wg|fan|pump|solenoid|purge|vvt|cam|idle|iac)\b/,
    strength: 0.6,
  },
];

/** Unit words a snake_case or spaced name may end with (`map_kpa`, `time_s`, `iat_c`). */
export const SUFFIX_UNITS: ReadonlySet<string> = new Set([
  's',
  'ms',
  'sec',
  'rpm',
  'kpa',
  'kpaa',
  'kpag',
  'psi',
  'psia',
  'psig',
  'bar',
  'bara',
  'barg',
  'inhg',
  'c',
  'f',
  'k',
  'degc',
  'degf',
  'pct',
  'kph',
  'kmh',
  'mph',
  'deg',
  'afr',
  'lambda',
  'phi',
]);

/** Words in a name that say how the mixture is written, for names without any unit text. */
export const MIXTURE_NAME_UNITS: ReadonlyArray<readonly [RegExp, 'afr' | 'phi' | 'lambda']> = [
  [/\b(afr|air fuel|a f)\b/, 'afr'],
  [/\b(phi|equivalence|eq ratio)\b/, 'phi'],
  [/\b(lambda|lam)\b/, 'lambda'],
];

/**
 * A column name in the form the patterns read: bracketed unit dropped, Greek λ and φ spelt
 * out, lower case, words separated by single spaces.
 */
export function normaliseColumnName(name: string): string {
  return (
    name
      .replace(/[[(][^[\]()]*[\])]\s*$/, '')
      .replace(/λ/g, ' lambda ')
      .replace(/[φϕ]/g, ' phi ')
      // camelCase words apart (engineRpm), but not unit spellings such as kPa or inHg
      .replace(/inHg/g, 'inhg')
      .replace(/([a-z]{2})([A-Z])/g, '$1 $2')
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, ' ')
      .trim()
  );
}
