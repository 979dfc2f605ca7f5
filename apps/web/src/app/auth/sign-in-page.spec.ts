import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { provideZonelessChangeDetection } from '@angular/core';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { Router, provideRouter } from '@angular/router';
import { CSRF_HEADER } from '@keelson/contracts';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { userWithRole } from '../testing/user-fixtures';
import { apiInterceptor } from './api-interceptor';
import { Session } from './session';
import { SignInPage } from './sign-in-page';

/** The API's refusal for wrong credentials (wording from the API's contract). */
const REFUSAL = {
  error: { code: 'invalid_credentials', message: 'E-mail or password is not right.' },
};

describe('SignInPage', () => {
  let fixture: ComponentFixture<SignInPage>;
  let backend: HttpTestingController;
  let navigateByUrl: ReturnType<typeof vi.spyOn>;

  async function create(mode: string | undefined = 'production'): Promise<HTMLElement> {
    fixture = TestBed.createComponent(SignInPage);
    fixture.componentRef.setInput('returnUrl', '/admin/users');
    await fixture.whenStable();
    backend.expectOne('/api/health').flush({ status: 'ok', db: 'ok', version: '0.1.0', mode });
    await fixture.whenStable();
    return fixture.nativeElement as HTMLElement;
  }

  function type(root: HTMLElement, selector: string, value: string): void {
    const input = root.querySelector<HTMLInputElement>(selector)!;
    input.value = value;
    input.dispatchEvent(new Event('input'));
    input.dispatchEvent(new Event('blur'));
  }

  function submit(root: HTMLElement): void {
    root.querySelector<HTMLButtonElement>('button[type="submit"]')!.click();
  }

  beforeEach(() => {
    TestBed.configureTestingModule({
      imports: [SignInPage],
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

  it('submits the credentials, records the user and goes to the return address', async () => {
    const root = await create();
    type(root, 'input[type="email"]', ' Risk@Demo.test ');
    type(root, 'input[formcontrolname="password"]', 'keelson-demo');
    submit(root);
    await fixture.whenStable();

    const login = backend.expectOne('/api/auth/login');
    expect(login.request.method).toBe('POST');
    expect(login.request.body).toEqual({ email: 'risk@demo.test', password: 'keelson-demo' });
    expect(login.request.headers.has(CSRF_HEADER)).toBe(true);
    expect(root.querySelector('mat-progress-bar')).not.toBeNull();
    expect(root.querySelector<HTMLButtonElement>('button[type="submit"]')!.disabled).toBe(true);

    login.flush({ user: userWithRole('risk_manager'), token: 'signed.jwt.token' });
    await fixture.whenStable();
    expect(TestBed.inject(Session).role()).toBe('risk_manager');
    expect(navigateByUrl).toHaveBeenCalledWith('/admin/users');
  });

  it("shows the API's error message as an alert and stays on the page", async () => {
    const root = await create();
    type(root, 'input[type="email"]', 'risk@demo.test');
    type(root, 'input[formcontrolname="password"]', 'not-the-password');
    submit(root);
    await fixture.whenStable();
    backend
      .expectOne('/api/auth/login')
      .flush(REFUSAL, { status: 401, statusText: 'Unauthorized' });
    await fixture.whenStable();

    expect(root.querySelector('[role="alert"]')?.textContent).toContain(
      'E-mail or password is not right.',
    );
    expect(navigateByUrl).not.toHaveBeenCalled();
    expect(root.querySelector<HTMLButtonElement>('button[type="submit"]')!.disabled).toBe(false);
  });

  it('shows validation messages and sends nothing when the form is empty', async () => {
    const root = await create();
    submit(root);
    await fixture.whenStable();
    const errors = [...root.querySelectorAll('mat-error')].map((node) => node.textContent?.trim());
    expect(errors).toEqual(['Enter your e-mail address.', 'Enter your password.']);
    backend.expectNone('/api/auth/login');
  });

  it('explains a malformed e-mail address', async () => {
    const root = await create();
    type(root, 'input[type="email"]', 'not-an-address');
    submit(root);
    await fixture.whenStable();
    expect(root.querySelector('mat-error')?.textContent).toContain('That is not an e-mail address');
  });

  it('offers the demo accounts in demo mode and fills the form from one', async () => {
    const root = await create('demo');
    const accounts = [...root.querySelectorAll<HTMLButtonElement>('.sign-in__account')];
    expect(accounts).toHaveLength(7);
    accounts.find((button) => button.textContent?.includes('plant.south@demo.test'))!.click();
    await fixture.whenStable();
    expect(root.querySelector<HTMLInputElement>('input[type="email"]')!.value).toBe(
      'plant.south@demo.test',
    );
    expect(root.querySelector<HTMLInputElement>('input[formcontrolname="password"]')!.value).toBe(
      'keelson-demo',
    );
  });

  it('shows no demo accounts outside demo mode', async () => {
    const root = await create('production');
    expect(root.querySelector('.sign-in__demo')).toBeNull();
  });
});
