import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { provideZonelessChangeDetection } from '@angular/core';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { Router, provideRouter } from '@angular/router';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { userWithRole } from '../testing/user-fixtures';
import { apiInterceptor } from './api-interceptor';
import { Session } from './session';
import { SetPasswordPage } from './set-password-page';

const TOKEN = 'tok_0123456789abcdef';
const INVITATION = {
  email: 'ines.ward@demo.test',
  name: 'Ines Ward',
  expiresAt: '2026-12-04T10:00:00.000Z',
};

describe('SetPasswordPage', () => {
  let fixture: ComponentFixture<SetPasswordPage>;
  let backend: HttpTestingController;
  let navigateByUrl: ReturnType<typeof vi.spyOn>;

  async function open(token: string | undefined): Promise<HTMLElement> {
    fixture = TestBed.createComponent(SetPasswordPage);
    if (token !== undefined) {
      fixture.componentRef.setInput('token', token);
    }
    await fixture.whenStable();
    return fixture.nativeElement as HTMLElement;
  }

  function type(root: HTMLElement, name: string, value: string): void {
    const input = root.querySelector<HTMLInputElement>(`input[formcontrolname="${name}"]`)!;
    input.value = value;
    input.dispatchEvent(new Event('input'));
    input.dispatchEvent(new Event('blur'));
  }

  beforeEach(() => {
    TestBed.configureTestingModule({
      imports: [SetPasswordPage],
      providers: [
        provideZonelessChangeDetection(),
        provideRouter([]),
        provideHttpClient(withInterceptors([apiInterceptor])),
        provideHttpClientTesting(),
      ],
    });
    backend = TestBed.inject(HttpTestingController);
    navigateByUrl = vi.spyOn(TestBed.inject(Router), 'navigateByUrl').mockResolvedValue(true);
  });

  afterEach(() => backend.verify());

  it('explains a link without a token and asks nothing of the server', async () => {
    const root = await open(undefined);
    expect(root.querySelector('[role="alert"]')?.textContent).toContain('no invitation token');
  });

  it("shows the server's reason when the invitation cannot be used", async () => {
    const root = await open(TOKEN);
    backend
      .expectOne(`/api/auth/invitations/${TOKEN}`)
      .flush(
        { error: { code: 'invitation_expired', message: 'This invitation has expired.' } },
        { status: 410, statusText: 'Gone' },
      );
    await fixture.whenStable();
    expect(root.querySelector('[role="alert"]')?.textContent).toContain(
      'This invitation has expired.',
    );
    expect(root.querySelector('form')).toBeNull();
  });

  it('shows the e-mail, checks both passwords, then saves and signs in', async () => {
    const root = await open(TOKEN);
    backend.expectOne(`/api/auth/invitations/${TOKEN}`).flush(INVITATION);
    await fixture.whenStable();
    expect(root.textContent).toContain('ines.ward@demo.test');

    type(root, 'password', 'short');
    type(root, 'confirmation', 'short');
    root.querySelector<HTMLButtonElement>('button[type="submit"]')!.click();
    await fixture.whenStable();
    expect(root.querySelector('mat-error')?.textContent).toContain('Use at least 10 characters.');

    type(root, 'password', 'harbour-lights-42');
    type(root, 'confirmation', 'harbour-lights-24');
    await fixture.whenStable();
    expect(root.textContent).toContain('The two passwords differ.');
    root.querySelector<HTMLButtonElement>('button[type="submit"]')!.click();
    backend.expectNone('/api/auth/set-password');

    type(root, 'confirmation', 'harbour-lights-42');
    root.querySelector<HTMLButtonElement>('button[type="submit"]')!.click();
    await fixture.whenStable();
    const save = backend.expectOne('/api/auth/set-password');
    expect(save.request.body).toEqual({ token: TOKEN, password: 'harbour-lights-42' });
    const invited = userWithRole('viewer', { email: INVITATION.email, name: INVITATION.name });
    save.flush({ user: invited });
    const login = backend.expectOne('/api/auth/login');
    expect(login.request.body).toEqual({ email: INVITATION.email, password: 'harbour-lights-42' });
    login.flush({ user: invited, token: 'signed.jwt.token' });
    await fixture.whenStable();

    expect(TestBed.inject(Session).user()?.email).toBe(INVITATION.email);
    expect(navigateByUrl).toHaveBeenCalledWith('/home');
  });
});
