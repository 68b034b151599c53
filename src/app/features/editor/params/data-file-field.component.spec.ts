import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import type { DataFileDto, DataFileSummaryDto } from '../../../../../shared/schema/api';
import { DataFileFieldComponent, type DataFilePick } from './data-file-field.component';

const LOOP_S1P = '# MHz S RI R 50\n0.5 0.2 -0.3\n2.0 0.1 -0.5\n';

function summary(id: string, name: string, kind: 's1p' | 's2p'): DataFileSummaryDto {
  return {
    id,
    name,
    kind,
    portCount: kind === 's1p' ? 1 : 2,
    pointCount: 2,
    fMinHz: 0.5e6,
    fMaxHz: 2e6,
    uploadedBy: 'Bench editor',
    createdAt: '2026-01-01T00:00:00.000Z',
  };
}

describe('DataFileFieldComponent', () => {
  let fixture: ComponentFixture<DataFileFieldComponent>;
  let http: HttpTestingController;
  let picked: DataFilePick[];

  beforeEach(async () => {
    TestBed.configureTestingModule({
      providers: [provideHttpClient(), provideHttpClientTesting()],
    });
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(DataFileFieldComponent);
    fixture.componentRef.setInput('workspaceId', 'w1');
    fixture.componentRef.setInput('kind', 's1p');
    fixture.componentRef.setInput('stageId', 'ant');
    picked = [];
    fixture.componentInstance.picked.subscribe((pick) => picked.push(pick));
    fixture.detectChanges();
    http
      .expectOne('/api/workspaces/w1/files')
      .flush([summary('f1', 'roof-loop.s1p', 's1p'), summary('f2', 'filter.s2p', 's2p')]);
    await settle();
  });

  afterEach(() => http.verify());

  /** Lets promises made by the component land, then renders. */
  async function settle(): Promise<void> {
    await new Promise((resolve) => setTimeout(resolve, 0));
    fixture.detectChanges();
    await fixture.whenStable();
  }

  function select(): HTMLSelectElement {
    return (fixture.nativeElement as HTMLElement).querySelector('select')!;
  }

  function optionTexts(): string[] {
    return [...select().options].map((o) => o.textContent!.trim());
  }

  async function choose(value: string): Promise<void> {
    select().value = value;
    select().dispatchEvent(new Event('change'));
    await settle();
  }

  async function pickFile(file: File): Promise<void> {
    const input = (fixture.nativeElement as HTMLElement).querySelector<HTMLInputElement>(
      'input[type=file]',
    )!;
    Object.defineProperty(input, 'files', { value: [file], configurable: true });
    input.dispatchEvent(new Event('change'));
    // Let the file be read before the request goes out.
    await settle();
  }

  it('should list the files of its kind, none, and the upload entry', () => {
    expect(optionTexts()).toEqual([
      'None: use the table below',
      'roof-loop.s1p (2 points)',
      'Upload Touchstone…',
    ]);
  });

  it('should accept only Touchstone files in its hidden file input', () => {
    const input = (fixture.nativeElement as HTMLElement).querySelector<HTMLInputElement>(
      'input[type=file]',
    )!;
    expect(input.accept).toBe('.s1p,.s2p,.ts'); // .ts: a Touchstone 2.0 file
    expect(input.hidden).toBe(true);
  });

  it('should emit the picked file and null for none', async () => {
    await choose('f1');
    await choose('');
    expect(picked).toEqual([
      { stageId: 'ant', fileId: 'f1' },
      { stageId: 'ant', fileId: null },
    ]);
  });

  it('should open the file chooser for the upload entry without emitting', async () => {
    const input = (fixture.nativeElement as HTMLElement).querySelector<HTMLInputElement>(
      'input[type=file]',
    )!;
    const click = jest.spyOn(input, 'click').mockImplementation(() => undefined);
    await choose('__upload');
    expect(click).toHaveBeenCalledTimes(1);
    expect(picked).toEqual([]);
    expect(select().value).toBe('');
  });

  it('should upload the chosen file as text and pick it', async () => {
    await pickFile(new File([LOOP_S1P], 'new-loop.s1p'));
    const req = http.expectOne('/api/workspaces/w1/files');
    expect(req.request.method).toBe('POST');
    expect(req.request.body).toEqual({ name: 'new-loop.s1p', content: LOOP_S1P });
    const stored: DataFileDto = { ...summary('f3', 'new-loop.s1p', 's1p'), content: LOOP_S1P };
    req.flush(stored);
    await settle();
    expect(picked).toEqual([{ stageId: 'ant', fileId: 'f3' }]);
    expect(optionTexts()).toContain('new-loop.s1p (2 points)');
  });

  it('should keep offering a file uploaded while the list was on its way', async () => {
    fixture.componentRef.setInput('workspaceId', 'w2');
    await settle();
    const list = http.expectOne('/api/workspaces/w2/files');
    await pickFile(new File([LOOP_S1P], 'new-loop.s1p'));
    http
      .expectOne({ method: 'POST', url: '/api/workspaces/w2/files' })
      .flush({ ...summary('f3', 'new-loop.s1p', 's1p'), content: LOOP_S1P });
    await settle();
    // The list was read before the upload was stored: it does not hold the new file.
    list.flush([summary('f1', 'roof-loop.s1p', 's1p')]);
    await settle();
    expect(picked).toEqual([{ stageId: 'ant', fileId: 'f3' }]);
    expect(optionTexts()).toEqual([
      'None: use the table below',
      'roof-loop.s1p (2 points)',
      'new-loop.s1p (2 points)',
      'Upload Touchstone…',
    ]);
  });

  it("should show the reader's refusal and pick nothing", async () => {
    await pickFile(new File(['# MHz S RI R 50\n1.0 0.2 x\n'], 'slip.s1p'));
    http
      .expectOne('/api/workspaces/w1/files')
      .flush(
        { error: 'invalid-data-file', message: 'slip.s1p, line 2: "x" is not a number' },
        { status: 422, statusText: 'Unprocessable Entity' },
      );
    await settle();
    expect(picked).toEqual([]);
    const alert = (fixture.nativeElement as HTMLElement).querySelector('[role=alert]')!;
    expect(alert.textContent).toContain('line 2');
  });
});
