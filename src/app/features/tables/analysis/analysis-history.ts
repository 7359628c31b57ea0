import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatSelectModule } from '@angular/material/select';
import type { AnalysisSummary } from '../../../core/api/analyses-api';

/** How many of a thing, with the noun in singular or plural: "1 log", "3 logs". */
function count(n: number, singular: string, plural = `${singular}s`): string {
  return `${n.toLocaleString('en-GB')} ${n === 1 ? singular : plural}`;
}

/**
 * One earlier analysis in a line: when it ran, on which revision, over how many logs, how many
 * cells it trusted and how many it flagged lean under load. `timeZone` is for tests; the
 * browser's own zone is used otherwise.
 */
export function analysisLine(summary: AnalysisSummary, timeZone?: string): string {
  const when = new Intl.DateTimeFormat('en-GB', {
    dateStyle: 'medium',
    timeStyle: 'short',
    timeZone,
  }).format(new Date(summary.createdAt));
  const lean = summary.leanFlagCount > 0 ? ` · ⚠ ${count(summary.leanFlagCount, 'lean flag')}` : '';
  return (
    `${when} · revision ${summary.baseRevisionNumber} · ${count(summary.logIds.length, 'log')} · ` +
    `${count(summary.trustedCells, 'trusted cell')}${lean}`
  );
}

/**
 * "Earlier analyses": a compact choice among a table's analyses, newest first, each told by
 * date, base revision, logs, trusted cells and lean flags. Choosing one asks to open it.
 */
@Component({
  selector: 'app-analysis-history',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatFormFieldModule, MatSelectModule],
  templateUrl: './analysis-history.html',
  styleUrl: './analysis-history.scss',
})
export class AnalysisHistory {
  /** The table's analyses, newest first. */
  readonly analyses = input.required<readonly AnalysisSummary[]>();
  /** The analysis shown now, if any. */
  readonly currentId = input<string | null>(null);
  /** Open the analysis with this id. */
  readonly open = output<string>();

  /** Each analysis with its line. */
  protected readonly rows = computed(() =>
    this.analyses().map((summary) => ({ id: summary.id, line: analysisLine(summary) })),
  );

  /** Asks to open `id` unless it is the one shown. */
  protected choose(id: string): void {
    if (id !== this.currentId()) this.open.emit(id);
  }
}
