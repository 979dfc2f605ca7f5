import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { provideZonelessChangeDetection } from '@angular/core';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { provideRouter } from '@angular/router';
import { MAIL_KIND_LABELS } from '@keelson/contracts';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { apiInterceptor } from '../auth/api-interceptor';
import { Session } from '../auth/session';
import { userWithRole } from '../testing/user-fixtures';
import { MailSettingsPage } from './mail-settings-page';

function words(node: Element | null): string {
  return (node?.textContent ?? '').replace(/\s+/g, ' ').trim();
}

describe('MailSettingsPage', () => {
  let fixture: ComponentFixture<MailSettingsPage>;
  let backend: HttpTestingController;
  let root: HTMLElement;

  async function settle(): Promise<void> {
    await fixture.whenStable();
    fixture.detectChanges();
  }

  function toggle(kind: string): HTMLButtonElement {
    return root.querySelector<HTMLButtonElement>(`mat-slide-toggle[data-kind="${kind}"] button`)!;
  }

  function button(label: string): HTMLButtonElement {
    return [...root.querySelectorAll<HTMLButtonElement>('button')].find(
      (candidate) => words(candidate) === label,
    )!;
  }

  function snackBar(): string {
    return words(document.querySelector('mat-snack-bar-container'));
  }

  beforeEach(async () => {
    TestBed.configureTestingModule({
      imports: [MailSettingsPage],
      providers: [
        provideZonelessChangeDetection(),
        provideRouter([]),
        provideHttpClient(withInterceptors([apiInterceptor])),
        provideHttpClientTesting(),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    backend = TestBed.inject(HttpTestingController);
    TestBed.inject(Session).signIn(userWithRole('plant_manager'));
    fixture = TestBed.createComponent(MailSettingsPage);
    root = fixture.nativeElement as HTMLElement;
    await settle();
  });

  afterEach(() => backend.verify());

  it('shows loading, then one switch per kind with its label, on unless switched off',
    async () => {
      expect(root.querySelector('mat-progress-bar')).not.toBeNull();
      expect(root.querySelector('mat-slide-toggle')).toBeNull();
      backend.expectOne('/api/me/mail-preferences').flush({ unsubscribed: ['digest'] });
      await settle();
      expect(root.querySelector('mat-progress-bar')).toBeNull();
      const labels = [...root.querySelectorAll('mat-slide-toggle label')].map(words);
      expect(labels).toEqual([
        MAIL_KIND_LABELS.plan_submitted,
        MAIL_KIND_LABELS.plan_decided,
        MAIL_KIND_LABELS.task_assigned,
        MAIL_KIND_LABELS.digest,
        MAIL_KIND_LABELS.rescoring,
      ]);
      expect(toggle('plan_submitted').getAttribute('aria-checked')).toBe('true');
      expect(toggle('digest').getAttribute('aria-checked')).toBe('false');
      expect(words(root.querySelector('.mail-settings__intro')))
        .toContain('sends you at plant.north@demo.test.');
      expect(button('Save').disabled).toBe(true);
    });

  it('saves the kinds switched off and confirms with a snackbar', async () => {
    backend.expectOne('/api/me/mail-preferences').flush({ unsubscribed: ['digest'] });
    await settle();
    toggle('task_assigned').click();
    toggle('digest').click();
    await settle();
    expect(button('Save').disabled).toBe(false);
    button('Save').click();
    await settle();
    const put = backend.expectOne('/api/me/mail-preferences');
    expect(put.request.method).toBe('PUT');
    expect(put.request.body).toEqual({ unsubscribed: ['task_assigned'] });
    expect(put.request.headers.get('x-keelson-csrf')).toBe('1');
    expect(button('Saving…').disabled).toBe(true);
    put.flush({ unsubscribed: ['task_assigned'] });
    await settle();
    expect(snackBar()).toContain('E-mail settings saved.');
    expect(toggle('task_assigned').getAttribute('aria-checked')).toBe('false');
    expect(toggle('digest').getAttribute('aria-checked')).toBe('true');
    expect(button('Save').disabled).toBe(true);
  });

  it('undoes unsaved changes', async () => {
    backend.expectOne('/api/me/mail-preferences').flush({ unsubscribed: [] });
    await settle();
    toggle('plan_decided').click();
    await settle();
    expect(toggle('plan_decided').getAttribute('aria-checked')).toBe('false');
    button('Undo changes').click();
    await settle();
    expect(toggle('plan_decided').getAttribute('aria-checked')).toBe('true');
    expect(button('Save').disabled).toBe(true);
  });

  it('shows the server\'s refusal and keeps the choice on screen', async () => {
    backend.expectOne('/api/me/mail-preferences').flush({ unsubscribed: [] });
    await settle();
    toggle('plan_submitted').click();
    await settle();
    button('Save').click();
    await settle();
    backend.expectOne('/api/me/mail-preferences').flush(
      { error: { code: 'invalid_request',
        message: 'The request is not valid: body.unsubscribed.0: Invalid option' } },
      { status: 400, statusText: 'Bad Request' },
    );
    await settle();
    expect(words(root.querySelector('[role="alert"] span')))
      .toBe('Not saved: The request is not valid: body.unsubscribed.0: Invalid option');
    expect(snackBar()).toContain('Not saved');
    expect(toggle('plan_submitted').getAttribute('aria-checked')).toBe('false');
    expect(button('Save').disabled).toBe(false);
  });

  it('says when the settings cannot be loaded, and tries again', async () => {
    backend.expectOne('/api/me/mail-preferences').flush(
      { error: { code: 'internal', message: 'The database is busy.' } },
      { status: 500, statusText: 'Server Error' },
    );
    await settle();
    expect(words(root.querySelector('[role="alert"]')))
      .toContain('Your e-mail settings could not be loaded: The database is busy.');
    expect(root.querySelector('mat-slide-toggle')).toBeNull();
    button('Try again').click();
    await settle();
    backend.expectOne('/api/me/mail-preferences').flush({ unsubscribed: [] });
    await settle();
    expect(root.querySelector('[role="alert"]')).toBeNull();
    expect(root.querySelectorAll('mat-slide-toggle')).toHaveLength(5);
  });
});
