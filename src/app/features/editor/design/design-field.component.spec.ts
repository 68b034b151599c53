import { Component, signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { DesignFieldComponent } from './design-field.component';

@Component({
  imports: [DesignFieldComponent],
  template: `<cw-design-field
    label="Coil Q of the parts"
    testId="match-ql"
    placeholder="e.g. 200"
    [(value)]="ql"
  />`,
})
class HostComponent {
  readonly ql = signal('200');
}

describe('DesignFieldComponent', () => {
  it("should show the panel's text under its label and write typing back to it", async () => {
    const fixture = TestBed.createComponent(HostComponent);
    await fixture.whenStable();
    const el: HTMLElement = fixture.nativeElement;
    const input = el.querySelector<HTMLInputElement>('label input[data-testid="match-ql"]')!;
    expect(input.closest('label')!.textContent!.trim()).toBe('Coil Q of the parts');
    expect(input.value).toBe('200');
    expect(input.placeholder).toBe('e.g. 200');
    input.value = '1e6';
    input.dispatchEvent(new Event('input'));
    expect(fixture.componentInstance.ql()).toBe('1e6');
    fixture.componentInstance.ql.set('75');
    await fixture.whenStable();
    expect(input.value).toBe('75');
  });
});
