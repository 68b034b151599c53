import { TestBed } from '@angular/core/testing';
import { MatDialog } from '@angular/material/dialog';
import { firstValueFrom } from 'rxjs';
import {
  ModeDialogComponent,
  type ModeDialogAnswer,
  type ModeDialogData,
} from './mode-dialog.component';

/** The mode dialog driven as a user would: typing a name, pressing Enter, Cancel. */
describe('ModeDialogComponent', () => {
  beforeEach(() => {
    // jsdom lays nothing out, so the focus trap finds no element visible enough to focus.
    const warn = console.warn.bind(console);
    jest.spyOn(console, 'warn').mockImplementation((...args: unknown[]) => {
      if (!String(args[0]).includes('is not focusable')) warn(...args);
    });
  });

  afterEach(() => {
    jest.restoreAllMocks();
    document.querySelectorAll('.cdk-overlay-container').forEach((e) => e.remove());
  });

  const dialog = () => document.querySelector<HTMLElement>('mat-dialog-container')!;
  const settle = async () => {
    TestBed.tick();
    await new Promise((resolve) => setTimeout(resolve, 0));
    TestBed.tick();
  };

  // The answer comes wrapped: an async function returning the bare promise would wait for it.
  async function open(
    data: ModeDialogData,
  ): Promise<{ answer: Promise<ModeDialogAnswer | undefined> }> {
    const ref = TestBed.inject(MatDialog).open<
      ModeDialogComponent,
      ModeDialogData,
      ModeDialogAnswer
    >(ModeDialogComponent, { data });
    const answer = firstValueFrom(ref.afterClosed());
    await settle();
    return { answer };
  }

  async function typeName(text: string): Promise<void> {
    const input = dialog().querySelector<HTMLInputElement>('[data-testid="mode-name"]')!;
    input.value = text;
    input.dispatchEvent(new Event('input'));
    await settle();
  }

  it('should close with the trimmed name and the kind when the form is submitted', async () => {
    const { answer } = await open({
      title: 'New mode',
      submitLabel: 'Add',
      name: '',
      kind: 'transmit',
    });
    expect(dialog().querySelector('h2')!.textContent).toContain('New mode');
    await typeName('  band 2 ');
    // Enter in the field submits the form, as the button does.
    dialog()
      .querySelector('form')!
      .dispatchEvent(new Event('submit', { cancelable: true }));
    await expect(answer).resolves.toEqual({ name: 'band 2', kind: 'transmit' });
  });

  it('should stay open and ask for a name when the name is blank', async () => {
    let settled = false;
    const { answer } = await open({
      title: 'Rename',
      submitLabel: 'Rename',
      name: 'rx',
      kind: 'receive',
    });
    void answer.then(() => (settled = true));
    await typeName('   ');
    const buttons = [...dialog().querySelectorAll('button')];
    buttons.find((b) => b.textContent!.trim() === 'Rename')!.click();
    await settle();
    expect(settled).toBe(false);
    expect(dialog().querySelector('mat-error')!.textContent).toContain('Enter a name');
    buttons.find((b) => b.textContent!.trim() === 'Cancel')!.click();
    await expect(answer).resolves.toBeUndefined();
  });
});
