import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { provideZonelessChangeDetection } from '@angular/core';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { provideRouter } from '@angular/router';
import type { PlantDto, UserDto } from '@keelson/contracts';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { apiInterceptor } from '../auth/api-interceptor';
import { Session } from '../auth/session';
import { userWithRole } from '../testing/user-fixtures';
import { UsersPage } from './users-page';

/** The demo workspace's plants (names as the API seeds them). */
const PLANTS: PlantDto[] = [
  { code: 'P-NORTH', name: 'Varnholm Works', country: 'DE' },
  { code: 'P-SOUTH', name: 'Castellar Works', country: 'ES' },
];

const USERS: UserDto[] = [
  userWithRole('admin'),
  userWithRole('plant_manager'),
  userWithRole('viewer', {
    id: 9,
    name: 'Ines Ward',
    email: 'ines.ward@demo.test',
    isInvitePending: true,
    lastLoginAt: null,
  }),
  userWithRole('buyer', { isActive: false }),
];

function texts(root: ParentNode, selector: string): string[] {
  return [...root.querySelectorAll(selector)].map((node) => node.textContent?.trim() ?? '');
}

describe('UsersPage', () => {
  let fixture: ComponentFixture<UsersPage>;
  let backend: HttpTestingController;
  let root: HTMLElement;

  async function settle(): Promise<void> {
    await fixture.whenStable();
    fixture.detectChanges();
  }

  beforeEach(async () => {
    TestBed.configureTestingModule({
      imports: [UsersPage],
      providers: [
        provideZonelessChangeDetection(),
        provideRouter([]),
        provideHttpClient(withInterceptors([apiInterceptor])),
        provideHttpClientTesting(),
        // Dialogs close at once instead of waiting for an animation jsdom never plays.
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    backend = TestBed.inject(HttpTestingController);
    TestBed.inject(Session).signIn(userWithRole('admin'));
    fixture = TestBed.createComponent(UsersPage);
    root = fixture.nativeElement as HTMLElement;
    await settle();
    backend.expectOne('/api/plants').flush({ items: PLANTS });
    const list = backend.expectOne((request) => request.url === '/api/users');
    expect(list.request.params.get('limit')).toBe('25');
    expect(list.request.params.get('offset')).toBe('0');
    list.flush({ items: USERS, total: USERS.length });
    await settle();
  });

  afterEach(() => backend.verify());

  it('renders one row per user from the API with role, plants, status and last sign-in', () => {
    const rows = [...root.querySelectorAll('tr.mat-mdc-row')];
    expect(rows).toHaveLength(4);
    expect(texts(rows[1]!, 'td').slice(0, 5)).toEqual([
      'Pia Lindqvist',
      'plant.north@demo.test',
      'Plant manager',
      'Varnholm Works',
      'Active',
    ]);
    expect(texts(rows[2]!, 'td')[4]).toBe('Invited');
    expect(texts(rows[2]!, 'td')[5]).toBe('Never');
    expect(texts(rows[3]!, 'td')[4]).toBe('Deactivated');
  });

  it('asks the server again, from the first page, when the filter text settles', async () => {
    const input = root.querySelector<HTMLInputElement>('input[type="search"]')!;
    input.value = 'pia';
    input.dispatchEvent(new Event('input'));
    await new Promise((resolve) => setTimeout(resolve, 300));
    await settle();
    const search = backend.expectOne((request) => request.url === '/api/users');
    expect(search.request.params.get('q')).toBe('pia');
    expect(search.request.params.get('offset')).toBe('0');
    search.flush({ items: [USERS[1]], total: 1 });
    await settle();
    expect(root.querySelectorAll('tr.mat-mdc-row')).toHaveLength(1);
  });

  it('shows the API error when the list cannot be read', async () => {
    (fixture.componentInstance as unknown as { reloads: { next(): void } }).reloads.next();
    backend
      .expectOne((request) => request.url === '/api/users')
      .flush(
        { error: { code: 'forbidden', message: 'This needs the role Administrator.' } },
        { status: 403, statusText: 'Forbidden' },
      );
    await settle();
    expect(root.querySelector('[role="alert"]')?.textContent).toContain(
      'This needs the role Administrator.',
    );
  });

  describe('invite dialog', () => {
    async function openInvite(): Promise<HTMLElement> {
      const invite = [...root.querySelectorAll<HTMLButtonElement>('button')].find((button) =>
        button.textContent?.includes('Invite'),
      )!;
      invite.click();
      await settle();
      return document.querySelector<HTMLElement>('mat-dialog-container')!;
    }

    function fill(dialog: HTMLElement, name: string, value: string): void {
      const input = dialog.querySelector<HTMLInputElement>(`input[formcontrolname="${name}"]`)!;
      input.value = value;
      input.dispatchEvent(new Event('input'));
      input.dispatchEvent(new Event('blur'));
    }

    async function chooseRole(dialog: HTMLElement, label: string): Promise<void> {
      const trigger = 'mat-select[formcontrolname="role"] .mat-mdc-select-trigger';
      dialog.querySelector<HTMLElement>(trigger)!.click();
      await settle();
      const option = [...document.querySelectorAll<HTMLElement>('mat-option')].find(
        (candidate) => candidate.textContent?.trim() === label,
      )!;
      option.click();
      await settle();
    }

    afterEach(() => {
      document.querySelectorAll('.cdk-overlay-container').forEach((node) => node.remove());
    });

    it('shows a message for every missing field and sends nothing', async () => {
      const dialog = await openInvite();
      dialog.querySelector<HTMLButtonElement>('button[type="submit"]')!.click();
      await settle();
      expect(texts(dialog, 'mat-error')).toEqual([
        "Enter the person's name.",
        'Enter their work e-mail address.',
        'Choose a role.',
      ]);
      backend.expectNone('/api/users/invitations');
    });

    it('rejects a malformed e-mail address', async () => {
      const dialog = await openInvite();
      fill(dialog, 'name', 'Ines Ward');
      fill(dialog, 'email', 'ines.ward-at-demo');
      await settle();
      expect(texts(dialog, 'mat-error')).toEqual([
        'That is not an e-mail address (name@company.com).',
      ]);
    });

    it('asks for plants only for a plant manager, and requires one', async () => {
      const dialog = await openInvite();
      expect(dialog.querySelector('mat-select[formcontrolname="plantCodes"]')).toBeNull();
      fill(dialog, 'name', 'Ines Ward');
      fill(dialog, 'email', 'ines.ward@demo.test');
      await chooseRole(dialog, 'Plant manager');
      expect(dialog.querySelector('mat-select[formcontrolname="plantCodes"]')).not.toBeNull();
      dialog.querySelector<HTMLButtonElement>('button[type="submit"]')!.click();
      await settle();
      expect(texts(dialog, 'mat-error')).toEqual(['A plant manager needs at least one plant.']);
      backend.expectNone('/api/users/invitations');

      await chooseRole(dialog, 'Viewer');
      expect(dialog.querySelector('mat-select[formcontrolname="plantCodes"]')).toBeNull();
    });

    it('sends a valid invitation, closes, and reloads the list', async () => {
      const dialog = await openInvite();
      fill(dialog, 'name', ' Ines Ward ');
      fill(dialog, 'email', 'Ines.Ward@Demo.test');
      await chooseRole(dialog, 'Risk manager');
      dialog.querySelector<HTMLButtonElement>('button[type="submit"]')!.click();
      await settle();
      const invite = backend.expectOne('/api/users/invitations');
      expect(invite.request.body).toEqual({
        name: 'Ines Ward',
        email: 'ines.ward@demo.test',
        role: 'risk_manager',
        plantCodes: [],
      });
      invite.flush({ user: userWithRole('risk_manager', { id: 9, email: 'ines.ward@demo.test' }) });
      await settle();
      backend
        .expectOne((request) => request.url === '/api/users')
        .flush({ items: USERS, total: USERS.length });
      await settle();
      expect(document.querySelector('mat-dialog-container')).toBeNull();
    });

    it("shows the API's refusal inside the dialog", async () => {
      const dialog = await openInvite();
      fill(dialog, 'name', 'Pia Again');
      fill(dialog, 'email', 'plant.north@demo.test');
      await chooseRole(dialog, 'Viewer');
      dialog.querySelector<HTMLButtonElement>('button[type="submit"]')!.click();
      await settle();
      backend
        .expectOne('/api/users/invitations')
        .flush(
          { error: { code: 'conflict', message: 'A user with this e-mail already exists.' } },
          { status: 409, statusText: 'Conflict' },
        );
      await settle();
      expect(dialog.querySelector('[role="alert"]')?.textContent).toContain(
        'A user with this e-mail already exists.',
      );
    });
  });
});
