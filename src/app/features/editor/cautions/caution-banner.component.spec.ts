import { TestBed } from '@angular/core/testing';
import type { StageTypeInfo } from '../../../../../shared/engine/types';
import { AMP, TANK } from '../testing/catalogue-fixture';
import { CautionBannerComponent } from './caution-banner.component';

describe('CautionBannerComponent', () => {
  it('should show nothing for a chain without cautions', async () => {
    const host = await render([TANK]);
    expect(host.querySelector('aside')).toBeNull();
  });

  it('should warn about plate voltages for a tube stage and defer to local codes', async () => {
    const host = await render([TANK, AMP]);
    expect(cautions(host)).toEqual(['high-voltage']);
    expect(host.textContent).toContain('plate voltages');
    expect(host.textContent).toContain('Defer to your local codes and to licensed practice');
  });

  it('should add the RF exposure note to a transmit path', async () => {
    const host = await render([{ ...TANK, cautions: ['transmit'] }]);
    expect(cautions(host)).toEqual(['transmit', 'rf-exposure']);
    expect(host.textContent).toContain('needs a licence');
  });

  it('should show the transmit caution for a chain with a transmit mode', async () => {
    const host = await render([TANK], true);
    expect(cautions(host)).toEqual(['transmit', 'rf-exposure']);
    expect(host.textContent).toContain('harmful interference');
    expect(host.textContent).toContain('Defer to your local codes and to licensed practice');
  });

  // Helpers

  async function render(types: StageTypeInfo[], transmit = false): Promise<HTMLElement> {
    const fixture = TestBed.createComponent(CautionBannerComponent);
    fixture.componentRef.setInput('types', types);
    fixture.componentRef.setInput('transmit', transmit);
    await fixture.whenStable();
    return fixture.nativeElement as HTMLElement;
  }

  function cautions(host: HTMLElement): string[] {
    return [...host.querySelectorAll('[data-caution]')].map((el) =>
      el.getAttribute('data-caution')!,
    );
  }
});
