import type { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import type { AnalysisSummary } from '../../../core/api/analyses-api';
import { noAnimations } from '../../../../testing/harness-helpers';
import { AnalysisHistory, analysisLine } from './analysis-history';

const NEWER: AnalysisSummary = {
  id: 'a2',
  tableId: 't1',
  baseRevisionId: 'r3',
  baseRevisionNumber: 3,
  logIds: ['l1', 'l2'],
  settings: {},
  createdAt: '2026-03-02T14:05:00.000Z',
  trustedCells: 41,
  leanFlagCount: 2,
  authorName: 'Tom Tuner',
};

const OLDER: AnalysisSummary = {
  ...NEWER,
  id: 'a1',
  baseRevisionNumber: 1,
  logIds: ['l1'],
  createdAt: '2026-02-27T09:30:00.000Z',
  trustedCells: 1,
  leanFlagCount: 0,
};

describe('analysisLine', () => {
  it.each([
    [
      'newer, lean-flagged',
      '2 Mar 2026, 14:05 · revision 3 · 2 logs · 41 trusted cells · ⚠ 2 lean flags',
      NEWER,
    ],
    ['older, no flags', '27 Feb 2026, 09:30 · revision 1 · 1 log · 1 trusted cell', OLDER],
    [
      'with one flag and many cells',
      '27 Feb 2026, 09:30 · revision 1 · 1 log · 1,200 trusted cells · ⚠ 1 lean flag',
      { ...OLDER, leanFlagCount: 1, trustedCells: 1200 },
    ],
  ])('When the analysis is %s, then it reads %j', (_, line, summary) => {
    expect(analysisLine(summary, 'UTC')).toBe(line);
  });
});

describe('AnalysisHistory', () => {
  let fixture: ComponentFixture<AnalysisHistory>;
  let loader: HarnessLoader;
  let opened: string[];

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [noAnimations] });
    fixture = TestBed.createComponent(AnalysisHistory);
    opened = [];
    fixture.componentInstance.open.subscribe((id) => opened.push(id));
    loader = TestbedHarnessEnvironment.loader(fixture);
  });

  it('When there are analyses, then the current one shows and choosing another opens it', async () => {
    fixture.componentRef.setInput('analyses', [NEWER, OLDER]);
    fixture.componentRef.setInput('currentId', 'a2');
    const select = await loader.getHarness(MatSelectHarness);
    expect(await select.getValueText()).toContain('revision 3');
    await select.open();
    const options = await select.getOptions();
    expect(options).toHaveLength(2);
    expect(await options[1].getText()).toContain('revision 1 · 1 log · 1 trusted cell');
    await select.clickOptions({ text: /revision 1/ });
    expect(opened).toEqual(['a1']);
  });

  it('When the current one is chosen again, then nothing is asked', async () => {
    fixture.componentRef.setInput('analyses', [NEWER, OLDER]);
    fixture.componentRef.setInput('currentId', null);
    const select = await loader.getHarness(MatSelectHarness);
    await select.open();
    await select.clickOptions({ text: /revision 3/ });
    expect(opened).toEqual(['a2']);
    fixture.componentRef.setInput('currentId', 'a2');
    await select.open();
    await select.clickOptions({ text: /revision 3/ });
    expect(opened).toEqual(['a2']);
  });

  it('When there are none, then it says so', async () => {
    fixture.componentRef.setInput('analyses', []);
    await fixture.whenStable();
    expect(await loader.getAllHarnesses(MatSelectHarness)).toHaveLength(0);
    expect(fixture.nativeElement.textContent).toContain('No earlier analyses of this table.');
  });
});
