import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { provideZonelessChangeDetection } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { Router, provideRouter } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { version } from '../network/network-fixtures';
import type { NetworkPicture, NetworkPictureNode } from './network-picture-dto';
import { NetworkPicturePage } from './network-picture-page';
import {
  NetworkPictureRenderer,
  type PictureEvents,
  type PictureHandle,
} from './network-picture-renderer';
import { AGGREGATED_PICTURE, runOf } from './risk-fixtures';

/** Stands in for cytoscape: records what was drawn and what was focused. */
class FakeRenderer {
  readonly drawn: NetworkPicture[] = [];
  readonly focused: string[] = [];
  destroyed = 0;
  events: PictureEvents | null = null;

  async render(_el: HTMLElement, picture: NetworkPicture, events: PictureEvents):
    Promise<PictureHandle> {
    this.drawn.push(picture);
    this.events = events;
    return {
      focus: (id) => {
        this.focused.push(id);
        return true;
      },
      zoomBy: () => undefined,
      fit: () => undefined,
      destroy: () => {
        this.destroyed++;
      },
    };
  }
}

const supplierNode = (code: string, isSinglePoint: boolean): NetworkPictureNode => ({
  id: `supplier:${code}`, kind: 'supplier', code, label: `${code} Works`, tier: 2, column: 4,
  isSinglePoint, revenueImpact: isSinglePoint ? 1000 : 0,
});

const FULL_PICTURE: NetworkPicture = {
  networkVersionId: 3, runId: 12, mode: 'full', totalNodes: 3, totalEdges: 1, singlePoints: 1,
  nodes: [
    supplierNode('S-2-SHARED-A', true), supplierNode('S-1-004', false),
    { id: 'plant:P-NORTH', kind: 'plant', code: 'P-NORTH', label: 'Varnholm Works', tier: null,
      column: 0, isSinglePoint: false, revenueImpact: null },
  ],
  edges: [{ source: 'supplier:S-2-SHARED-A', target: 'supplier:S-1-004' }],
};

describe('NetworkPicturePage', () => {
  let harness: RouterTestingHarness;
  let backend: HttpTestingController;
  let renderer: FakeRenderer;
  let root: HTMLElement;

  async function settle(): Promise<void> {
    await harness.fixture.whenStable();
    harness.detectChanges();
    await harness.fixture.whenStable();
  }

  beforeEach(async () => {
    renderer = new FakeRenderer();
    TestBed.configureTestingModule({
      providers: [
        provideZonelessChangeDetection(),
        provideRouter([
          { path: 'risk', component: NetworkPicturePage },
          { path: '**', children: [] },
        ]),
        provideHttpClient(),
        provideHttpClientTesting(),
        { provide: NetworkPictureRenderer, useValue: renderer },
      ],
    });
    backend = TestBed.inject(HttpTestingController);
    harness = await RouterTestingHarness.create('/risk');
    root = harness.routeNativeElement!;
    await settle();
    backend.expectOne((r) => r.url === '/api/network-versions')
      .flush({ items: [version(3), version(2)], total: 2 });
    await settle();
    // Newest first; run 14 failed, so the latest succeeded run is 12.
    const runs = backend.expectOne((r) => r.url === '/api/analysis-runs');
    expect(runs.request.params.get('networkVersionId')).toBe('3');
    runs.flush({ items: [runOf(14, 3, 'failed'), runOf(12, 3), runOf(9, 3)], total: 3 });
    await settle();
  });

  afterEach(() => backend.verify());

  it('asks for the latest version with its latest succeeded run', async () => {
    const request = backend.expectOne((r) => r.url === '/api/network-versions/3/picture');
    expect(request.request.params.get('runId')).toBe('12');
    request.flush(FULL_PICTURE);
    await settle();
    expect(renderer.drawn).toEqual([FULL_PICTURE]);
    expect(root.querySelector('.picture__aggregated')).toBeNull();
    expect(root.querySelector('.picture__summary')?.textContent).toContain(
      '1 single point of failure in run 12');
  });

  it('says the picture is grouped by tier and country when the server groups it', async () => {
    backend.expectOne((r) => r.url === '/api/network-versions/3/picture')
      .flush(AGGREGATED_PICTURE);
    await settle();
    const note = root.querySelector('.picture__aggregated')?.textContent ?? '';
    expect(note).toContain('4,210 nodes');
    expect(note).toContain('grouped by tier and country');
    expect(renderer.drawn[0]?.mode).toBe('aggregated');
    // The group with a single point is listed beside the picture.
    expect(root.querySelector('.picture__singles')?.textContent).toContain('Tier 2 · CZ: 1');
  });

  it('focuses the best match of a search and lists the single points as links', async () => {
    backend.expectOne((r) => r.url === '/api/network-versions/3/picture').flush(FULL_PICTURE);
    await settle();
    const input = root.querySelector<HTMLInputElement>('input[type="search"]')!;
    input.value = 's-1';
    input.dispatchEvent(new KeyboardEvent('keydown', { key: 'Enter' }));
    await settle();
    expect(renderer.focused).toEqual(['supplier:S-1-004']);
    expect(root.querySelector('.picture__search-message')?.textContent).toContain(
      'Showing S-1-004 Works.');
    const single = root.querySelector<HTMLAnchorElement>('.picture__singles a');
    expect(single?.getAttribute('href')).toBe('/risk/12/suppliers/S-2-SHARED-A');
  });

  it('opens the risk page of a clicked supplier in the chosen run', async () => {
    backend.expectOne((r) => r.url === '/api/network-versions/3/picture').flush(FULL_PICTURE);
    await settle();
    renderer.events!.nodeSelected(FULL_PICTURE.nodes[1]!);
    await settle();
    expect(TestBed.inject(Router).url).toBe('/risk/12/suppliers/S-1-004');
  });
});
