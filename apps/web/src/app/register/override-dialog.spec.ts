import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { provideZonelessChangeDetection } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { MatDialog, type MatDialogRef } from '@angular/material/dialog';
import type { RegisterEntryDto } from '@keelson/contracts';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { apiInterceptor } from '../auth/api-interceptor';
import { OverrideDialog } from './override-dialog';
import { registerEntry } from './register-fixtures';

function words(node: Element): string {
  return (node.textContent ?? '').replace(/\s+/g, ' ').trim();
}

describe('OverrideDialog', () => {
  let backend: HttpTestingController;
  let dialogRef: MatDialogRef<OverrideDialog, boolean>;
  let dialog: HTMLElement;
  let closedWith: boolean | undefined | 'open';

  async function settle(): Promise<void> {
    await new Promise((resolve) => setTimeout(resolve));
    TestBed.tick();
  }

  async function open(entry: RegisterEntryDto): Promise<void> {
    dialogRef = TestBed.inject(MatDialog).open<OverrideDialog, RegisterEntryDto, boolean>(
      OverrideDialog,
      { data: entry },
    );
    closedWith = 'open';
    dialogRef.afterClosed().subscribe((value) => (closedWith = value));
    await settle();
    dialog = document.querySelector<HTMLElement>('mat-dialog-container')!;
  }

  async function choose(label: string): Promise<void> {
    dialog.querySelector<HTMLElement>('.mat-mdc-select-trigger')!.click();
    await settle();
    [...document.querySelectorAll<HTMLElement>('mat-option')]
      .find((option) => words(option) === label)!
      .click();
    await settle();
  }

  async function typeReason(text: string): Promise<void> {
    const reason = dialog.querySelector<HTMLTextAreaElement>('textarea')!;
    reason.value = text;
    reason.dispatchEvent(new Event('input'));
    await settle();
  }

  async function submit(): Promise<void> {
    dialog.querySelector<HTMLButtonElement>('button[type="submit"]')!.click();
    await settle();
  }

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [
        provideZonelessChangeDetection(),
        provideHttpClient(withInterceptors([apiInterceptor])),
        provideHttpClientTesting(),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    backend = TestBed.inject(HttpTestingController);
  });

  afterEach(() => {
    backend.verify();
    document.querySelectorAll('.cdk-overlay-container').forEach((node) => node.remove());
  });

  it('refuses an empty or blank reason and sends nothing', async () => {
    await open(registerEntry(12));
    await choose('4 · likely');
    await submit();
    expect([...dialog.querySelectorAll('mat-error')].map(words)).toEqual([
      'Say why you override it.',
    ]);
    await typeReason('   ');
    await submit();
    expect([...dialog.querySelectorAll('mat-error')].map(words)).toEqual([
      'Say why you override it.',
    ]);
    await typeReason('fire');
    await submit();
    expect([...dialog.querySelectorAll('mat-error')].map(words)).toEqual([
      'Say why in at least 5 characters.',
    ]);
    backend.expectNone('/api/register/12/likelihood');
    expect(closedWith).toBe('open');
  });

  it('asks for a value before sending', async () => {
    await open(registerEntry(12));
    await typeReason('New audit findings.');
    await submit();
    expect([...dialog.querySelectorAll('mat-error')].map(words)).toEqual(['Choose a likelihood.']);
    backend.expectNone('/api/register/12/likelihood');
  });

  it('posts the value and the trimmed reason with the CSRF header, then closes', async () => {
    await open(registerEntry(12));
    expect(words(dialog)).toContain('computed likelihood 3.');
    await choose('5 · almost certain');
    await typeReason('  Supplier filed for insolvency protection.  ');
    await submit();
    const post = backend.expectOne('/api/register/12/likelihood');
    expect(post.request.method).toBe('POST');
    expect(post.request.headers.get('x-keelson-csrf')).toBe('1');
    expect(post.request.body).toEqual({
      likelihood: 5,
      reason: 'Supplier filed for insolvency protection.',
    });
    post.flush({});
    await settle();
    expect(closedWith).toBe(true);
  });

  it('offers "back to computed" for an overridden entry and sends null', async () => {
    await open(registerEntry(12, { computedLikelihood: 3, likelihoodOverride: 5 }));
    expect(words(dialog)).toContain('computed likelihood 3; now overridden to 5.');
    await choose('Back to computed (3)');
    await typeReason('Insolvency proceedings were dropped.');
    await submit();
    const post = backend.expectOne('/api/register/12/likelihood');
    expect(post.request.body).toEqual({
      likelihood: null,
      reason: 'Insolvency proceedings were dropped.',
    });
    post.flush({});
    await settle();
    expect(closedWith).toBe(true);
  });

  it('stays open and shows the server message when it refuses', async () => {
    await open(registerEntry(12));
    await choose('2 · unlikely');
    await typeReason('Second source qualified.');
    await submit();
    backend
      .expectOne('/api/register/12/likelihood')
      .flush(
        { error: { code: 'forbidden', message: 'This needs the role Risk manager.' } },
        { status: 403, statusText: 'Forbidden' },
      );
    await settle();
    expect(words(dialog.querySelector('[role="alert"]')!)).toContain(
      'This needs the role Risk manager.',
    );
    expect(closedWith).toBe('open');
  });
});
