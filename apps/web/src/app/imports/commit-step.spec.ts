import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { provideZonelessChangeDetection } from '@angular/core';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import type { ImportCommitDto } from '@keelson/contracts';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { apiInterceptor } from '../auth/api-interceptor';
import { CommitStep, changeLines } from './commit-step';
import { batchFixture, commitFixture } from './import-fixtures';

describe('changeLines', () => {
  it('lists every kind of change in a fixed order, naming codes where there are any', () => {
    const lines = changeLines(commitFixture().changes);
    expect(lines.map((line) => [line.label, line.count])).toEqual([
      ['Suppliers added', 2],
      ['Suppliers removed', 1],
      ['Suppliers changed', 0],
      ['Sourcing rows added', 3],
      ['Sourcing rows removed', 1],
      ['Sourcing rows changed', 2],
      ['Products added', 0],
      ['Products removed', 0],
      ['Products changed', 1],
    ]);
    expect(lines[0]!.codes).toEqual(['V-7', 'V-9']);
  });
});

describe('CommitStep', () => {
  let fixture: ComponentFixture<CommitStep>;
  let backend: HttpTestingController;
  let root: HTMLElement;
  let committed: ImportCommitDto[];

  async function settle(): Promise<void> {
    await fixture.whenStable();
    fixture.detectChanges();
  }

  function commitButton(): HTMLButtonElement {
    return [...root.querySelectorAll<HTMLButtonElement>('button')].find((button) =>
      button.textContent?.includes('Commit as a new network version'),
    )!;
  }

  async function create(status: 'ready' | 'rejected' | 'committed'): Promise<void> {
    fixture = TestBed.createComponent(CommitStep);
    const errorCount = status === 'rejected' ? 4 : 0;
    const networkVersionId = status === 'committed' ? 4 : null;
    fixture.componentRef.setInput('batch', batchFixture({ status, errorCount, networkVersionId }));
    root = fixture.nativeElement as HTMLElement;
    committed = [];
    fixture.componentInstance.committed.subscribe((result) => committed.push(result));
    await settle();
  }

  beforeEach(() => {
    TestBed.configureTestingModule({
      imports: [CommitStep],
      providers: [
        provideZonelessChangeDetection(),
        provideRouter([]),
        provideHttpClient(withInterceptors([apiInterceptor])),
        provideHttpClientTesting(),
      ],
    });
    backend = TestBed.inject(HttpTestingController);
  });

  afterEach(() => backend.verify());

  it('keeps the commit disabled while the file has errors, and says why', async () => {
    await create('rejected');
    expect(commitButton().disabled).toBe(true);
    expect(root.textContent).toContain('it has 4 errors');
    expect(root.textContent).toContain('nothing of it is written');
    commitButton().click();
    backend.expectNone('/api/imports/41/commit');
  });

  it('commits a ready file and shows the new version with what changed', async () => {
    await create('ready');
    expect(commitButton().disabled).toBe(false);
    commitButton().click();
    await settle();
    const request = backend.expectOne('/api/imports/41/commit');
    expect(request.request.method).toBe('POST');
    request.flush(commitFixture(), { status: 201, statusText: 'Created' });
    await settle();
    expect(root.querySelector('h3')?.textContent).toContain('Network version 4 is saved');
    expect(root.textContent).toContain('Compared with version 3');
    const lines = [...root.querySelectorAll('.commit__changes tr')].map((line) =>
      [...line.children].map((cell) => cell.textContent?.trim()),
    );
    expect(lines[0]).toEqual(['Suppliers added', '2', 'V-7, V-9']);
    expect(lines[3]).toEqual(['Sourcing rows added', '3', '']);
    expect(lines[8]).toEqual(['Products changed', '1', 'PR-10']);
    expect(root.querySelector('a[href="/network/4/suppliers"]')?.textContent)
      .toContain('Open network version 4');
    expect(committed.map((result) => result.networkVersionId)).toEqual([4]);
  });

  it('says nothing was written when the server finds errors (422)', async () => {
    await create('ready');
    commitButton().click();
    await settle();
    backend.expectOne('/api/imports/41/commit').flush(
      {
        error: {
          code: 'invalid_workbook',
          message: 'The workbook has 2 errors.',
          details: [],
        },
      },
      { status: 422, statusText: 'Unprocessable Entity' },
    );
    await settle();
    const alert = root.querySelector('[role="alert"]')?.textContent ?? '';
    expect(alert).toContain('The file has errors, so nothing was written.');
    expect(alert).toContain('The workbook has 2 errors.');
    expect(committed).toEqual([]);
  });

  it("shows the server's reason for a conflict (409)", async () => {
    await create('ready');
    commitButton().click();
    await settle();
    backend.expectOne('/api/imports/41/commit').flush(
      { error: { code: 'conflict', message: 'This import has already been committed.' } },
      { status: 409, statusText: 'Conflict' },
    );
    await settle();
    expect(root.querySelector('[role="alert"]')?.textContent).toContain(
      'This import has already been committed.',
    );
    expect(commitButton().disabled).toBe(false);
  });

  it('for a batch committed earlier names its version and links the network', async () => {
    await create('committed');
    expect(root.textContent).toContain('This file became network version 4');
    expect(root.querySelector('a[href="/network/4/suppliers"]')).not.toBeNull();
  });
});
