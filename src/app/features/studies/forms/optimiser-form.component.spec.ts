import { ComponentFixture, TestBed } from '@angular/core/testing';
import type { ChainDocument } from '../../../../../shared/schema/chain';
import type { StudySpecInput } from '../../../../../shared/schema/studies';
import { OptimiserFormComponent } from './optimiser-form.component';

/** Just what the form reads of a chain: stages with values, and f0. */
const DOC = {
  settings: { f0Hz: 7e6 },
  stages: [
    { id: 'ant', type: 'antenna', label: 'Antenna', values: { r: 50 } },
    { id: 'pre', type: 'tank', label: 'Preselector', values: { c: 200e-12, l: 2.2e-6 } },
    { id: 'det', type: 'detector', label: 'Detector', values: { r: 10e3 } },
  ],
} as unknown as ChainDocument;

describe('OptimiserFormComponent', () => {
  let fixture: ComponentFixture<OptimiserFormComponent>;
  let el: HTMLElement;
  let emitted: StudySpecInput[];

  beforeEach(async () => {
    fixture = TestBed.createComponent(OptimiserFormComponent);
    fixture.componentRef.setInput('document', DOC);
    emitted = [];
    fixture.componentInstance.run.subscribe((spec) => emitted.push(spec));
    el = fixture.nativeElement;
    await fixture.whenStable();
  });

  const all = (id: string) => [...el.querySelectorAll<HTMLElement>(`[data-testid="${id}"]`)];
  const labels = (row: HTMLElement) =>
    [...row.querySelectorAll('label')].map((l) => l.childNodes[0].textContent!.trim());

  async function set(control: HTMLInputElement | HTMLSelectElement, value: string) {
    control.value = value;
    control.dispatchEvent(new Event(control instanceof HTMLSelectElement ? 'change' : 'input'));
    await fixture.whenStable();
  }

  it('should start with the capacitance of the first tunable stage and a resonance goal', () => {
    const [variable] = all('opt-variable');
    expect(variable.querySelector<HTMLSelectElement>('[data-testid="opt-key"]')!.value).toBe('c');
    expect(variable.querySelector<HTMLInputElement>('[data-testid="opt-min"]')!.value).toBe(
      '100 pF',
    );
    expect(variable.querySelector<HTMLInputElement>('[data-testid="opt-max"]')!.value).toBe(
      '400 pF',
    );
    const [goal] = all('opt-goal');
    expect(goal.getAttribute('data-kind')).toBe('resonance');
    expect(labels(goal)).toEqual(['Goal', 'Tuned circuit of', 'at', 'Weight']);
    // One row each: nothing to remove.
    expect(el.querySelectorAll('.row button').length).toBe(0);
  });

  it('should show the fields each goal kind reads, in order', async () => {
    el.querySelector<HTMLButtonElement>('[data-testid="opt-add-goal"]')!.click();
    await fixture.whenStable();
    const kind = () => all('opt-goal')[1].querySelector<HTMLSelectElement>('select')!;
    expect(labels(all('opt-goal')[1])).toEqual(['Goal', 'Node', 'Width', 'Weight']);
    await set(kind(), 'ripple');
    expect(labels(all('opt-goal')[1])).toEqual([
      'Goal',
      'Node',
      'From',
      'To',
      'At most (dB)',
      'Weight',
    ]);
    await set(kind(), 'return-loss');
    expect(labels(all('opt-goal')[1])).toEqual(['Goal', 'From', 'To', 'At least (dB)', 'Weight']);
    await set(kind(), 'gain');
    expect(labels(all('opt-goal')[1])).toEqual(['Goal', 'Target (dB)', 'Weight']);
  });

  it('should emit the spec with SI values from the typed rows', async () => {
    const variable = all('opt-variable')[0];
    await set(variable.querySelector<HTMLSelectElement>('[data-testid="opt-key"]')!, 'l');
    expect(variable.querySelector<HTMLInputElement>('[data-testid="opt-min"]')!.value).toBe(
      '1.1 µH',
    );
    await set(variable.querySelector<HTMLInputElement>('[data-testid="opt-max"]')!, '3 uH');
    await set(all('opt-goal')[0].querySelector<HTMLInputElement>('[data-testid="opt-target"]')!, '7.1 MHz'); // prettier-ignore
    el.querySelector<HTMLButtonElement>('[data-testid="run-opt"]')!.click();
    expect(emitted).toHaveLength(1);
    const spec = emitted[0] as Extract<StudySpecInput, { kind: 'optimiser' }>;
    expect(spec.variables).toEqual([
      { stageId: 'pre', key: 'l', min: expect.closeTo(1.1e-6, 12), max: expect.closeTo(3e-6, 12) },
    ]);
    expect(spec.goals).toEqual([
      { kind: 'resonance', stageId: 'pre', targetHz: expect.closeTo(7.1e6, 3), weight: 1 },
    ]);
  });

  it('should name the row and the field that does not read as a quantity', async () => {
    await set(all('opt-variable')[0].querySelector<HTMLInputElement>('[data-testid="opt-min"]')!, 'lots'); // prettier-ignore
    el.querySelector<HTMLButtonElement>('[data-testid="run-opt"]')!.click();
    await fixture.whenStable();
    expect(emitted).toHaveLength(0);
    expect(el.querySelector('[data-testid="opt-problem"]')!.textContent).toContain('value 1, from');
  });

  it('should add and remove rows, offering removal only while there are two', async () => {
    el.querySelector<HTMLButtonElement>('[data-testid="opt-add-variable"]')!.click();
    await fixture.whenStable();
    expect(all('opt-variable')).toHaveLength(2);
    all('opt-variable')[1].querySelector<HTMLButtonElement>('button')!.click();
    await fixture.whenStable();
    expect(all('opt-variable')).toHaveLength(1);
    expect(all('opt-variable')[0].querySelector('button')).toBeNull();
  });
});
