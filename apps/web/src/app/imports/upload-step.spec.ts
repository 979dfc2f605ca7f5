import { HttpEventType, provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { provideZonelessChangeDetection } from '@angular/core';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import type { ImportBatchDto } from '@keelson/contracts';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { apiInterceptor } from '../auth/api-interceptor';
import { batchFixture } from './import-fixtures';
import { UPLOAD_UNREACHABLE_MESSAGE, UploadStep } from './upload-step';

function workbook(name = 'harbour-network.xlsx', bytes = 48_000): File {
  return new File([new Uint8Array(bytes)], name, {
    type: 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
  });
}

describe('UploadStep', () => {
  let fixture: ComponentFixture<UploadStep>;
  let backend: HttpTestingController;
  let root: HTMLElement;
  let uploaded: ImportBatchDto[];

  async function settle(): Promise<void> {
    await fixture.whenStable();
    fixture.detectChanges();
  }

  function pick(file: File): void {
    const picker = root.querySelector<HTMLInputElement>('input[type="file"]')!;
    Object.defineProperty(picker, 'files', {
      configurable: true,
      value: { length: 1, item: (index: number) => (index === 0 ? file : null) },
    });
    picker.dispatchEvent(new Event('change'));
  }

  beforeEach(async () => {
    TestBed.configureTestingModule({
      imports: [UploadStep],
      providers: [
        provideZonelessChangeDetection(),
        provideRouter([]),
        provideHttpClient(withInterceptors([apiInterceptor])),
        provideHttpClientTesting(),
      ],
    });
    backend = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(UploadStep);
    root = fixture.nativeElement as HTMLElement;
    uploaded = [];
    fixture.componentInstance.uploaded.subscribe((batch) => uploaded.push(batch));
    await settle();
  });

  afterEach(() => backend.verify());

  it('states the accepted kinds, the 20 MB limit and links the empty template', () => {
    expect(root.textContent).toContain('(.xlsx)');
    expect(root.textContent).toContain('(.csv)');
    expect(root.textContent).toContain('(.zip)');
    expect(root.textContent).toContain('up to 20 MB');
    const template = root.querySelector<HTMLAnchorElement>('a[download]')!;
    expect(template.getAttribute('href')).toBe('/api/imports/template.xlsx');
    const picker = root.querySelector<HTMLInputElement>('input[type="file"]')!;
    expect(picker.accept).toBe('.xlsx,.csv,.zip');
  });

  it('posts the picked file as multipart, shows the progress, then emits the batch', async () => {
    const file = workbook();
    pick(file);
    await settle();
    const request = backend.expectOne('/api/imports');
    expect(request.request.method).toBe('POST');
    expect(request.request.reportProgress).toBe(true);
    expect(request.request.headers.get('x-keelson-csrf')).toBe('1');
    const body = request.request.body as FormData;
    expect(body).toBeInstanceOf(FormData);
    expect((body.get('file') as File).name).toBe('harbour-network.xlsx');
    expect(body.get('mapping')).toBeNull();

    request.event({ type: HttpEventType.UploadProgress, loaded: 12_000, total: 48_000 });
    await settle();
    const bar = root.querySelector('mat-progress-bar')!;
    expect(bar.getAttribute('aria-valuenow')).toBe('25');
    expect(root.textContent).toContain('Uploading harbour-network.xlsx: 25 %');

    request.flush(batchFixture(), { status: 201, statusText: 'Created' });
    await settle();
    expect(uploaded.map((batch) => batch.id)).toEqual([41]);
    expect(root.querySelector('mat-progress-bar')).toBeNull();
  });

  it('opens the picker from the drop zone with Enter and with Space', async () => {
    const picker = root.querySelector<HTMLInputElement>('input[type="file"]')!;
    const click = vi.spyOn(picker, 'click').mockImplementation(() => undefined);
    const zone = root.querySelector<HTMLElement>('[role="button"]')!;
    expect(zone.tabIndex).toBe(0);
    zone.dispatchEvent(new KeyboardEvent('keydown', { key: 'Enter', bubbles: true }));
    zone.dispatchEvent(new KeyboardEvent('keydown', { key: ' ', bubbles: true }));
    expect(click).toHaveBeenCalledTimes(2);
  });

  it('uploads a file dropped on the zone', async () => {
    const zone = root.querySelector<HTMLElement>('[role="button"]')!;
    const drop = new Event('drop', { bubbles: true, cancelable: true });
    const file = workbook('purchases.csv', 900);
    Object.defineProperty(drop, 'dataTransfer', { value: { files: { item: () => file } } });
    zone.dispatchEvent(drop);
    await settle();
    const request = backend.expectOne('/api/imports');
    expect(((request.request.body as FormData).get('file') as File).name).toBe('purchases.csv');
    request.flush(batchFixture({ fileName: 'purchases.csv' }), { status: 201, statusText: '' });
  });

  it('refuses a file of another kind without sending it', async () => {
    pick(workbook('network.pdf'));
    await settle();
    backend.expectNone('/api/imports');
    expect(root.querySelector('[role="alert"]')?.textContent).toContain(
      'network.pdf is not a file Keelson reads',
    );
  });

  it('explains a 413 with the file size and the limit', async () => {
    pick(workbook('huge.xlsx', 3 * 1024 * 1024));
    await settle();
    backend
      .expectOne('/api/imports')
      .flush(
        { error: { code: 'file_too_large', message: 'The file is larger than allowed.' } },
        { status: 413, statusText: 'Payload Too Large' },
      );
    await settle();
    const alert = root.querySelector('[role="alert"]')?.textContent ?? '';
    expect(alert).toContain('huge.xlsx (3 MB) is larger than the server accepts');
    expect(alert).toContain('20 MB');
    expect(uploaded).toEqual([]);
  });

  it('names the limit the server sends with its 413', async () => {
    pick(workbook('big.xlsx', 12 * 1024 * 1024));
    await settle();
    backend.expectOne('/api/imports').flush(
      {
        error: {
          code: 'file_too_large',
          message: 'The file is larger than the upload limit of 10 MB.',
          details: { limitBytes: 10 * 1024 * 1024 },
        },
      },
      { status: 413, statusText: 'Payload Too Large' },
    );
    await settle();
    expect(root.querySelector('[role="alert"]')?.textContent).toContain(
      'big.xlsx (12 MB) is larger than the server accepts (10 MB).',
    );
  });

  it('says the upload did not reach the server on a network failure', async () => {
    pick(workbook());
    await settle();
    backend.expectOne('/api/imports').error(new ProgressEvent('error'), { status: 0 });
    await settle();
    expect(root.querySelector('[role="alert"]')?.textContent).toContain(
      UPLOAD_UNREACHABLE_MESSAGE,
    );
  });

  it('cancels a running upload', async () => {
    pick(workbook());
    await settle();
    const request = backend.expectOne('/api/imports');
    const cancel = [...root.querySelectorAll('button')].find((button) =>
      button.textContent?.includes('Cancel upload'),
    )!;
    cancel.click();
    await settle();
    expect(request.cancelled).toBe(true);
    expect(root.querySelector('[role="alert"]')?.textContent).toContain('Upload cancelled');
  });
});
