import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { Component, provideZonelessChangeDetection } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { Router, provideRouter } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import type { Role } from '@keelson/contracts';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { Session } from '../auth/session';
import { userWithRole } from '../testing/user-fixtures';
import { NetworkLandingPage } from './network-landing-page';
import { version } from './network-fixtures';

@Component({ selector: 'kl-version-stand-in', template: 'version page' })
class VersionStandIn {}

describe('NetworkLandingPage', () => {
  let harness: RouterTestingHarness;
  let backend: HttpTestingController;

  async function settle(): Promise<void> {
    await harness.fixture.whenStable();
    harness.detectChanges();
  }

  async function open(role: Role): Promise<HTMLElement> {
    TestBed.inject(Session).signIn(userWithRole(role));
    harness = await RouterTestingHarness.create('/network');
    await settle();
    return harness.routeNativeElement!;
  }

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [
        provideZonelessChangeDetection(),
        provideRouter([
          { path: 'network', component: NetworkLandingPage },
          { path: 'network/:versionId/suppliers', component: VersionStandIn },
        ]),
        provideHttpClient(),
        provideHttpClientTesting(),
      ],
    });
    backend = TestBed.inject(HttpTestingController);
  });

  afterEach(() => backend.verify());

  it('opens the latest version on its suppliers tab', async () => {
    await open('viewer');
    backend.expectOne('/api/network-versions/latest').flush(version(4));
    await settle();
    expect(TestBed.inject(Router).url).toBe('/network/4/suppliers');
  });

  it('shows the empty state with the way to the import when nothing is imported yet', async () => {
    const root = await open('buyer');
    backend
      .expectOne('/api/network-versions/latest')
      .flush(
        { error: { code: 'not_found', message: 'No network has been imported yet.' } },
        { status: 404, statusText: 'Not Found' },
      );
    await settle();
    expect(root.textContent).toContain('No network yet');
    expect(root.querySelector('a[href="/imports"]')?.textContent).toContain('Import a workbook');
    expect(root.querySelector('[role="alert"]')).toBeNull();
    expect(TestBed.inject(Router).url).toBe('/network');
  });

  it('tells a role that cannot import whom to ask, with no import link', async () => {
    const root = await open('plant_manager');
    backend
      .expectOne('/api/network-versions/latest')
      .flush({ error: { code: 'not_found', message: 'None.' } }, { status: 404, statusText: 'x' });
    await settle();
    expect(root.textContent).toContain('Ask a buyer in your team to import the workbook.');
    expect(root.querySelector('a[href="/imports"]')).toBeNull();
  });

  it('shows other failures as errors, not as an empty network', async () => {
    const root = await open('viewer');
    backend
      .expectOne('/api/network-versions/latest')
      .flush(
        { error: { code: 'internal', message: 'The database is not reachable.' } },
        { status: 500, statusText: 'Server Error' },
      );
    await settle();
    expect(root.querySelector('[role="alert"]')?.textContent).toContain(
      'The database is not reachable.',
    );
    expect(root.textContent).not.toContain('No network yet');
  });
});
