import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { MatSnackBar } from '@angular/material/snack-bar';
import { SKIP_ERROR_SNACKBAR } from '../../../core/http/http-context';
import { sampleDocument } from '../testing/catalogue-fixture';
import { ChainExport, fileNameFromDisposition } from './chain-export';

describe('ChainExport', () => {
  let exporter: ChainExport;
  let http: HttpTestingController;
  const snackOpen = jest.fn();
  let blobs: Blob[];
  let revoked: string[];
  let clicks: { download: string; href: string; attached: boolean }[];
  let click: jest.SpyInstance;

  beforeEach(() => {
    jest.useFakeTimers();
    snackOpen.mockReset();
    blobs = [];
    revoked = [];
    clicks = [];
    URL.createObjectURL = (blob: Blob) => {
      blobs.push(blob);
      return `blob:export-${blobs.length}`;
    };
    URL.revokeObjectURL = (url: string) => void revoked.push(url);
    click = jest.spyOn(HTMLAnchorElement.prototype, 'click').mockImplementation(function (
      this: HTMLAnchorElement,
    ) {
      clicks.push({ download: this.download, href: this.href, attached: this.isConnected });
    });
    TestBed.configureTestingModule({
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        { provide: MatSnackBar, useValue: { open: snackOpen } },
      ],
    });
    exporter = TestBed.inject(ChainExport);
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => {
    http.verify();
    click.mockRestore();
    jest.useRealTimers();
  });

  it('should post the document and format, and save the answer under the server name', async () => {
    const chain = sampleDocument();
    const done = exporter.download(chain, 'spice');
    expect(exporter.busy()).toBe('spice');
    const req = http.expectOne('/api/export');
    expect(req.request.method).toBe('POST');
    expect(req.request.body).toEqual({ document: chain, format: 'spice' });
    expect(req.request.responseType).toBe('text');
    req.flush('Chainwright chain\n.end\n', {
      headers: {
        'Content-Type': 'text/plain; charset=utf-8',
        'Content-Disposition': 'attachment; filename="ten-metre-first-try.cir"',
      },
    });
    expect(await done).toBe('ten-metre-first-try.cir');
    expect(clicks).toEqual([
      { download: 'ten-metre-first-try.cir', href: 'blob:export-1', attached: true },
    ]);
    expect(blobs[0].type).toBe('text/plain; charset=utf-8');
    expect(await blobs[0].text()).toBe('Chainwright chain\n.end\n');
    expect(document.body.querySelector('a[download]')).toBeNull();
    expect(revoked).toEqual([]);
    jest.runAllTimers();
    expect(revoked).toEqual(['blob:export-1']);
    expect(exporter.busy()).toBeNull();
  });

  it('should send the Touchstone reference resistance when one is chosen', async () => {
    const done = exporter.download(sampleDocument(), 'touchstone', { z0: 75 });
    const req = http.expectOne('/api/export');
    expect(req.request.body).toMatchObject({ format: 'touchstone', z0: 75 });
    req.flush('# HZ S RI R 75\n', {
      headers: { 'Content-Disposition': 'attachment; filename="x.s2p"' },
    });
    expect(await done).toBe('x.s2p');
  });

  it('should show the reason of a refused export and download nothing', async () => {
    const done = exporter.download(sampleDocument(), 'touchstone');
    http.expectOne('/api/export').flush(
      JSON.stringify({
        error: 'cannot-export',
        message: 'stage 4 "Mixer" (mixer) changes the frequency; export the stages separately',
      }),
      { status: 422, statusText: 'Unprocessable Entity' },
    );
    expect(await done).toBeNull();
    expect(clicks).toEqual([]);
    expect(snackOpen).toHaveBeenCalledTimes(1);
    expect(snackOpen.mock.calls[0][0]).toBe(
      'The Touchstone file was not made: Stage 4 "Mixer" (mixer) changes the frequency; ' +
        'export the stages separately.',
    );
  });

  it('should leave other failures to the error interceptor', async () => {
    const done = exporter.download(sampleDocument(), 'json');
    const req = http.expectOne('/api/export');
    expect(req.request.context.get(SKIP_ERROR_SNACKBAR)).toEqual([422]);
    req.flush('failed', { status: 500, statusText: 'Server Error' });
    expect(await done).toBeNull();
    expect(snackOpen).not.toHaveBeenCalled();
  });

  describe('fileNameFromDisposition', () => {
    it('should read quoted, bare and encoded names, and drop folders', () => {
      expect(fileNameFromDisposition('attachment; filename="a-b.chain.json"')).toBe(
        'a-b.chain.json',
      );
      expect(fileNameFromDisposition('attachment; filename=tank.cir')).toBe('tank.cir');
      expect(fileNameFromDisposition("attachment; filename*=UTF-8''%CE%A9-tank.s2p")).toBe(
        'Ω-tank.s2p',
      );
      expect(fileNameFromDisposition('attachment; filename="../../etc/tank.cir"')).toBe('tank.cir');
      expect(fileNameFromDisposition('attachment')).toBeNull();
      expect(fileNameFromDisposition(null)).toBeNull();
    });
  });
});
