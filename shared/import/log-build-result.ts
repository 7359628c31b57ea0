import type { Channel, ColumnarLog } from '../core/channels';

/** One thing wrong in a file: the line (from 0), the CSV column, the channel and what. */
export interface ImportProblem {
  /** Line number in the file, counting from 0. */
  readonly row: number;
  /** The CSV column's header text. */
  readonly column: string;
  /** The canonical channel the column feeds. */
  readonly channel: Channel;
  /** What is wrong, for a person. */
  readonly message: string;
}

/** Counts of what the builder did with the rows it was given. */
export interface ImportStats {
  /** Data rows seen (blank lines, header, units row and preamble excluded). */
  readonly rowsRead: number;
  /** Rows that became samples. */
  readonly rowsKept: number;
  /** Rows dropped because a required channel could not be read. */
  readonly rowsDroppedUnreadable: number;
  /** Rows dropped because their time went back. */
  readonly rowsDroppedTimeBack: number;
  /**
   * Rows dropped because a value lay outside its channel's plausible range (`PLAUSIBLE_RANGES`);
   * a row also unreadable counts as unreadable only.
   */
  readonly rowsDroppedImplausible: number;
  /** Blank lines among the data. */
  readonly blankRows: number;
  /** All problems found; `problems` keeps at most `maxProblems` of them. */
  readonly problemCount: number;
  /** Dropped rows (unreadable, time going back, implausible) as a share of rows read (0–1). */
  readonly droppedFraction: number;
  /** Whether more than `mostlyBadFraction` of the rows were dropped: the file needs a look. */
  readonly isMostlyBad: boolean;
}

/** What `LogBuilder.finish` returns. */
export interface LogBuildResult {
  /** The samples, in canonical units. */
  readonly log: ColumnarLog;
  /** The problems found, in file order (at most `maxProblems`). */
  readonly problems: readonly ImportProblem[];
  /** Row counts. */
  readonly stats: ImportStats;
}
