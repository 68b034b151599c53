import { ChangeDetectionStrategy, Component, computed, input, output, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { describeGang, gangGroups, gangMembers } from '../../../../../shared/engine/gang';
import type { ChainDocument } from '../../../../../shared/schema/chain';
import type { StudySpecInput } from '../../../../../shared/schema/studies';
import { fillOnceLoaded, numberOf, textOf, tunableStages, unitOfKey } from './tunable';

/**
 * The band study's form. By default it turns the gang marked on the chain (the editor's
 * "Variable" marks); a gang typed here overrides the marks for this run only.
 */
@Component({
  selector: 'cw-band-form',
  imports: [MatButtonModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  styleUrl: './study-form.scss',
  template: `
    <div class="form" data-testid="band-form">
      <p>
        Turns a ganged tuning capacitor (or inductor) from its minimum to its maximum and follows
        every tuned circuit across the dial.
      </p>
      <label
        >Gang
        <select data-testid="band-source" (change)="source.set(text($event))">
          @for (g of groups(); track g) {
            <option [value]="'marked:' + g" [selected]="source() === 'marked:' + g">
              marked on the chain: {{ g }} ({{ describe(g) }})
            </option>
          }
          <option value="typed" [selected]="source() === 'typed'">typed here, for this run</option>
        </select>
      </label>
      @if (source() === 'typed') {
        <label
          >Gang section in
          <select data-testid="band-stage" (change)="stage.set(text($event))">
            @for (s of tunable(); track s.id) {
              <option [value]="s.id" [selected]="s.id === stage()">{{ s.label }}</option>
            }
          </select>
        </label>
        <label
          >Value
          <input data-testid="band-key" [value]="key()" (input)="key.set(text($event))" size="4"
        /></label>
        <label
          >Minimum (pF)
          <input
            data-testid="band-min"
            type="number"
            [value]="minPf()"
            (input)="minPf.set(num($event))"
        /></label>
        <label
          >Maximum (pF)
          <input
            data-testid="band-max"
            type="number"
            [value]="maxPf()"
            (input)="maxPf.set(num($event))"
        /></label>
      }
      <label
        >Dial positions
        <input
          data-testid="band-positions"
          type="number"
          min="2"
          max="201"
          [value]="positions()"
          (input)="positions.set(num($event))"
      /></label>
      <label class="check"
        ><input type="checkbox" [checked]="oscillator()" (change)="oscillator.set(!oscillator())" />
        Superhet oscillator on the same gang</label
      >
      @if (oscillator()) {
        <label
          >Oscillator coil (µH)
          <input type="number" [value]="oscLUh()" (input)="oscLUh.set(num($event))"
        /></label>
        <label
          >Trimmer (pF)
          <input type="number" [value]="oscTrimPf()" (input)="oscTrimPf.set(num($event))"
        /></label>
        <label
          >Padder (pF, 0 = none)
          <input type="number" [value]="oscPadPf()" (input)="oscPadPf.set(num($event))"
        /></label>
      }
      <button mat-flat-button type="button" data-testid="run-band" (click)="submit()">
        Run band study
      </button>
    </div>
  `,
})
export class BandFormComponent {
  readonly document = input<ChainDocument | undefined>(undefined);
  readonly run = output<StudySpecInput>();

  protected readonly text = textOf;
  protected readonly num = numberOf;
  protected readonly tunable = computed(() => tunableStages(this.document()));
  protected readonly groups = computed(() => {
    const doc = this.document();
    return doc ? gangGroups(doc) : [];
  });
  /** 'marked:<group>' or 'typed'. */
  protected readonly source = signal('typed');
  protected readonly stage = signal('');
  protected readonly key = signal('c');
  protected readonly minPf = signal(20);
  protected readonly maxPf = signal(400);
  protected readonly positions = signal(41);
  protected readonly oscillator = signal(false);
  protected readonly oscLUh = signal(100);
  protected readonly oscTrimPf = signal(10);
  protected readonly oscPadPf = signal(0);

  constructor() {
    fillOnceLoaded(this.document, (doc) => this.reset(doc));
  }

  /** Chooses the chain's first marked gang, else the first tunable stage (once loaded). */
  reset(doc: ChainDocument): void {
    const groups = gangGroups(doc);
    this.source.set(groups.length ? `marked:${groups[0]}` : 'typed');
    const first = tunableStages(doc)[0];
    if (first) {
      this.stage.set(first.id);
      this.key.set(first.keys.includes('c') ? 'c' : first.keys[0]);
    }
  }

  protected describe(group: string): string {
    const doc = this.document();
    return doc ? describeGang(gangMembers(doc, group), (m) => unitOfKey(m.key)) : '';
  }

  protected submit(): void {
    const pf = 1e-12;
    const src = this.source();
    this.run.emit({
      kind: 'band',
      ...(src.startsWith('marked:')
        ? { gangGroup: src.slice('marked:'.length) }
        : { gang: [{ stageId: this.stage(), key: this.key(), min: this.minPf() * pf, max: this.maxPf() * pf }] }), // prettier-ignore
      positions: this.positions(),
      ...(this.oscillator()
        ? { oscillator: { l: this.oscLUh() * 1e-6, trimmer: this.oscTrimPf() * pf, padder: this.oscPadPf() * pf } } // prettier-ignore
        : {}),
    });
  }
}
