import { HttpEventType, provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { provideZonelessChangeDetection } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { batchFixture } from './import-fixtures';
import { ImportMappingsApi } from './import-mappings-api';
import { ImportsApi, type UploadState, queryParams } from './imports-api';

describe('queryParams', () => {
  it('keeps given values as text and leaves out blank ones', () => {
    const params = queryParams({ q: '  V-7 ', sheet: '', kind: undefined, limit: 25, offset: 0 });
    expect(params.keys()).toEqual(['q', 'limit', 'offset']);
    expect(params.get('q')).toBe('V-7');
    expect(params.get('offset')).toBe('0');
  });
});

describe('ImportsApi', () => {
  let api: ImportsApi;
  let backend: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [
        provideZonelessChangeDetection(),
        provideHttpClient(),
        provideHttpClientTesting(),
      ],
    });
    api = TestBed.inject(ImportsApi);
    backend = TestBed.inject(HttpTestingController);
  });

  afterEach(() => backend.verify());

  it('uploads with a saved mapping id and reports progress, then the batch', () => {
    const states: UploadState[] = [];
    api.upload(new File(['a,b'], 'sites.csv'), 12).subscribe((state) => states.push(state));
    const request = backend.expectOne('/api/imports');
    const body = request.request.body as FormData;
    expect(body.get('mapping')).toBe('12');
    expect((body.get('file') as File).name).toBe('sites.csv');
    request.event({ type: HttpEventType.Sent });
    request.event({ type: HttpEventType.UploadProgress, loaded: 3 });
    request.flush(batchFixture({ status: 'ready' }), { status: 201, statusText: 'Created' });
    expect(states).toEqual([
      { kind: 'progress', loaded: 3, total: null },
      { kind: 'done', batch: batchFixture({ status: 'ready' }) },
    ]);
  });

  it('asks for the inspection with a saved mapping only when one is given', () => {
    api.inspection(41).subscribe();
    api.inspection(41, 5).subscribe();
    const plain = backend.expectOne(
      (request) =>
        request.url === '/api/imports/41/inspection' && !request.params.has('mappingId'),
    );
    const saved = backend.expectOne((request) => request.params.get('mappingId') === '5');
    plain.flush({});
    saved.flush({});
  });

  it('lists batches with the status filter and paging', () => {
    api.list({ status: 'rejected', limit: 25, offset: 50 }).subscribe();
    const request = backend.expectOne((candidate) => candidate.url === '/api/imports');
    expect(request.request.params.toString()).toBe('status=rejected&limit=25&offset=50');
    request.flush({ items: [], total: 0 });
  });

  it('names the download addresses of the error report and the template', () => {
    expect(api.errorReportUrl(41)).toBe('/api/imports/41/error-report.xlsx');
    expect(api.templateUrl()).toBe('/api/imports/template.xlsx');
  });
});

describe('ImportMappingsApi', () => {
  it('unwraps the list and deletes by id', () => {
    TestBed.configureTestingModule({
      providers: [
        provideZonelessChangeDetection(),
        provideHttpClient(),
        provideHttpClientTesting(),
      ],
    });
    const api = TestBed.inject(ImportMappingsApi);
    const backend = TestBed.inject(HttpTestingController);
    let names: string[] = [];
    api.list().subscribe((items) => (names = items.map((item) => item.name)));
    backend.expectOne('/api/import-mappings').flush({
      items: [
        {
          id: 3,
          name: 'Harbour ERP export',
          mapping: {},
          headerSignature: 'ab',
          createdBy: null,
          createdAt: '2026-11-01T09:00:00.000Z',
          lastUsedAt: null,
        },
      ],
    });
    expect(names).toEqual(['Harbour ERP export']);
    api.remove(3).subscribe();
    expect(backend.expectOne('/api/import-mappings/3').request.method).toBe('DELETE');
    backend.verify();
  });
});
