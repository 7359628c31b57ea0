import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { signal } from '@angular/core';
import { TestBed, type ComponentFixture } from '@angular/core/testing';
import type { LogResource } from '@shared/contracts/logs';
import type { Role } from '@shared/contracts/roles';
import { Session } from '../../../core/auth/session';
import { noAnimations } from '../../../../testing/harness-helpers';
import { LogFactsEditor } from './log-facts-editor';

const LOG = {
  id: 'log-1',
  vehicleId: 'veh-1',
  fileName: 'drive.csv',
  kind: 'road',
  ecuRevisionId: null,
  status: 'ready',
} as unknown as LogResource;

function setUp(roles: Role[]): {
  fixture: ComponentFixture<LogFactsEditor>;
  http: HttpTestingController;
} {
  TestBed.configureTestingModule({
    providers: [
      provideHttpClient(),
      provideHttpClientTesting(),
      noAnimations,
      { provide: Session, useValue: { user: signal({ roles }) } },
    ],
  });
  const http = TestBed.inject(HttpTestingController);
  const fixture = TestBed.createComponent(LogFactsEditor);
  fixture.componentRef.setInput('log', LOG);
  fixture.detectChanges();
  http.expectOne('/api/vehicles/veh-1/tables').flush({ items: [], total: 0 });
  fixture.detectChanges();
  return { fixture, http };
}

function button(fixture: ComponentFixture<LogFactsEditor>, text: RegExp): HTMLButtonElement | null {
  const all = [...(fixture.nativeElement as HTMLElement).querySelectorAll('button')];
  return all.find((b) => text.test(b.textContent ?? '')) ?? null;
}

describe('LogFactsEditor', () => {
  afterEach(() => TestBed.inject(HttpTestingController).verify());

  it('When a tuner deletes, then the first press asks and the second sends DELETE', () => {
    const { fixture, http } = setUp(['tuner']);
    const deleted = jest.fn();
    fixture.componentInstance.deleted.subscribe(deleted);
    button(fixture, /Delete this log/)?.click();
    fixture.detectChanges();
    http.expectNone('/api/logs/log-1');
    button(fixture, /Delete for good/)?.click();
    const req = http.expectOne('/api/logs/log-1');
    expect(req.request.method).toBe('DELETE');
    req.flush(null, { status: 204, statusText: 'No Content' });
    expect(deleted).toHaveBeenCalled();
  });

  it('When an operator opens a log, then the kind and revision can change but nothing deletes', () => {
    const { fixture } = setUp(['operator']);
    expect(button(fixture, /Save/)).not.toBeNull();
    expect(button(fixture, /Delete/)).toBeNull();
  });

  it('When a reviewer opens a log, then nothing can change', () => {
    const { fixture } = setUp(['reviewer']);
    expect((fixture.nativeElement as HTMLElement).querySelector('button')).toBeNull();
  });
});
