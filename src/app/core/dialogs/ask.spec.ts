import { TestBed } from '@angular/core/testing';
import { Ask } from './ask';

/** The app's own question dialogs, driven as a user would: typing, clicking, Escape. */
describe('Ask', () => {
  let ask: Ask;

  beforeEach(() => {
    // jsdom lays nothing out, so the focus trap finds no element visible enough to focus.
    const warn = console.warn.bind(console);
    jest.spyOn(console, 'warn').mockImplementation((...args: unknown[]) => {
      if (!String(args[0]).includes('is not focusable')) warn(...args);
    });
    TestBed.configureTestingModule({});
    ask = TestBed.inject(Ask);
  });

  afterEach(() => {
    jest.restoreAllMocks();
    document.querySelectorAll('.cdk-overlay-container').forEach((e) => e.remove());
  });

  const dialog = () => document.querySelector<HTMLElement>('mat-dialog-container')!;
  const button = (name: string) =>
    [...dialog().querySelectorAll('button')].find((b) => b.textContent!.trim() === name)!;
  const settle = async () => {
    TestBed.tick();
    await new Promise((resolve) => setTimeout(resolve, 0));
    TestBed.tick();
  };

  async function typeInto(text: string): Promise<void> {
    const input = dialog().querySelector('input')!;
    input.value = text;
    input.dispatchEvent(new Event('input'));
    await settle();
  }

  it('should read a resistance as people type it and close with its SI value', async () => {
    const answer = ask.value({
      title: 'Touchstone at another reference',
      label: 'Reference resistance',
      kind: 'ohm',
      initial: '75 Ω',
      submitLabel: 'Export',
      check: (v) => (v > 0 ? null : 'enter a resistance above 0 Ω'),
    });
    await settle();
    expect(dialog().querySelector('h2')!.textContent).toContain('another reference');
    await typeInto('1k');
    button('Export').click();
    await expect(answer).resolves.toBe(1000);
  });

  it('should keep the dialog open and say what to fix for a value it cannot take', async () => {
    let settled = false;
    const answer = ask.value({
      title: 'Reference',
      label: 'Reference resistance',
      kind: 'ohm',
      initial: '75',
      submitLabel: 'Export',
      check: (v) => (v > 0 ? null : 'enter a resistance above 0 Ω'),
    });
    void answer.then(() => (settled = true));
    await settle();
    await typeInto('-5');
    button('Export').click();
    await settle();
    expect(settled).toBe(false);
    expect(dialog().querySelector('mat-error')!.textContent).toContain(
      'Enter a resistance above 0 Ω.',
    );
    button('Cancel').click();
    await expect(answer).resolves.toBeNull();
  });

  it('should answer a confirmation true on its verb and false on cancel', async () => {
    const yes = ask.confirm({ title: 'Delete comment', message: 'Sure?', confirmLabel: 'Delete' });
    await settle();
    button('Delete').click();
    await expect(yes).resolves.toBe(true);

    const no = ask.confirm({
      title: 'Leave without saving?',
      message: 'Unsaved.',
      confirmLabel: 'Leave',
      cancelLabel: 'Stay',
      tone: 'plain',
    });
    await settle();
    expect(button('Leave').classList.contains('cw-danger')).toBe(false);
    button('Stay').click();
    await expect(no).resolves.toBe(false);
  });

  it('should give a name trimmed, and null when cancelled', async () => {
    const named = ask.name({
      title: 'Save as a variant',
      label: 'Name of the variant',
      initial: 'Loop (variant)',
      maxLength: 200,
      submitLabel: 'Save variant',
    });
    await settle();
    await typeInto('  Loop, wider tank  ');
    button('Save variant').click();
    await expect(named).resolves.toBe('Loop, wider tank');

    const cancelled = ask.name({
      title: 'Rename',
      label: 'Name',
      initial: 'Loop',
      maxLength: 200,
      submitLabel: 'Rename',
    });
    await settle();
    button('Cancel').click();
    await expect(cancelled).resolves.toBeNull();
  });
});
