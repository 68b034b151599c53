import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import {
  applySignificantFigures,
  DEFAULT_SIGNIFICANT_FIGURES,
} from '../../../core/format/number-format';
import { EditorStore } from '../state/editor.store';
import { CATALOGUE } from '../testing/catalogue-fixture';
import { chainDto } from '../testing/chain-dto';
import { PlanViewComponent } from './plan-view.component';

/** Past the view's 150 ms pause before it asks the server. */
const pause = () => new Promise((resolve) => setTimeout(resolve, 200));

describe('PlanViewComponent', () => {
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [provideHttpClient(), provideHttpClientTesting(), EditorStore],
    });
    const store = TestBed.inject(EditorStore);
    store.setCatalogue(CATALOGUE);
    store.load(chainDto());
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => {
    applySignificantFigures(DEFAULT_SIGNIFICANT_FIGURES);
    http.verify();
  });

  it("should ask for the plan at the user's figures, again when they change, and show a refusal", async () => {
    applySignificantFigures(3);
    const fixture = TestBed.createComponent(PlanViewComponent);
    fixture.componentRef.setInput('document', TestBed.inject(EditorStore).doc());
    await fixture.whenStable();
    await pause();
    const first = http.expectOne('/api/analysis');
    expect(first.request.body).toMatchObject({ plan: 'full', sweep: false, figures: 3 });
    first.flush(
      { error: 'invalid-chain', message: 'the IF 455 kHz is above the LO' },
      { status: 422, statusText: 'Unprocessable Entity' },
    );
    await fixture.whenStable();
    expect((fixture.nativeElement as HTMLElement).textContent).toContain('455 kHz is above');

    // The refusal's values are written on the server: a new setting asks again.
    applySignificantFigures(6);
    await fixture.whenStable();
    await pause();
    const again = http.expectOne('/api/analysis');
    expect(again.request.body.figures).toBe(6);
    again.flush({ error: 'invalid-chain', message: 'x' }, { status: 422, statusText: 'x' });
    await fixture.whenStable();
  });
});
