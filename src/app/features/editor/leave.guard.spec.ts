import { TestBed } from '@angular/core/testing';
import type { ActivatedRouteSnapshot, RouterStateSnapshot } from '@angular/router';
import { Ask } from '../../core/dialogs/ask';
import type { ConfirmDialogData } from '../../core/dialogs/confirm-dialog.component';
import { editorLeaveGuard, type LeaveAware } from './leave.guard';

describe('editorLeaveGuard', () => {
  let answer: boolean;
  let asked: ConfirmDialogData[];

  beforeEach(() => {
    asked = [];
    answer = false;
    TestBed.configureTestingModule({
      providers: [
        {
          provide: Ask,
          useValue: {
            confirm: (data: ConfirmDialogData) => {
              asked.push(data);
              return Promise.resolve(answer);
            },
          },
        },
      ],
    });
  });

  it('should let the user leave without asking when nothing is unsaved', () => {
    expect(run({ hasUnsavedEdits: () => false })).toBe(true);
    expect(asked).toEqual([]);
  });

  it('should ask in our dialog when edits are unsaved and stay when the user says no', async () => {
    answer = false;
    await expect(run({ hasUnsavedEdits: () => true })).resolves.toBe(false);
    expect(asked).toHaveLength(1);
    expect(asked[0].message).toContain('not saved');
    expect(asked[0]).toMatchObject({ confirmLabel: 'Leave', cancelLabel: 'Stay' });
  });

  it('should leave when the user confirms', async () => {
    answer = true;
    await expect(run({ hasUnsavedEdits: () => true })).resolves.toBe(true);
  });

  // Helpers

  function run(page: LeaveAware): unknown {
    const route = {} as ActivatedRouteSnapshot;
    const state = {} as RouterStateSnapshot;
    return TestBed.runInInjectionContext(() => editorLeaveGuard(page, route, state, state));
  }
});
