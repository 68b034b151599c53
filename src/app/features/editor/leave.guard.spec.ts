import type { ActivatedRouteSnapshot, RouterStateSnapshot } from '@angular/router';
import { editorLeaveGuard, type LeaveAware } from './leave.guard';

describe('editorLeaveGuard', () => {
  afterEach(() => jest.restoreAllMocks());

  it('should let the user leave without asking when nothing is unsaved', () => {
    const ask = jest.spyOn(window, 'confirm');
    expect(run({ hasUnsavedEdits: () => false })).toBe(true);
    expect(ask).not.toHaveBeenCalled();
  });

  it('should ask when edits are unsaved and stay when the user says no', () => {
    const ask = jest.spyOn(window, 'confirm').mockReturnValue(false);
    expect(run({ hasUnsavedEdits: () => true })).toBe(false);
    expect(ask).toHaveBeenCalledWith(expect.stringContaining('not saved'));
  });

  it('should leave when the user confirms', () => {
    jest.spyOn(window, 'confirm').mockReturnValue(true);
    expect(run({ hasUnsavedEdits: () => true })).toBe(true);
  });

  // Helpers

  function run(page: LeaveAware): unknown {
    const route = {} as ActivatedRouteSnapshot;
    const state = {} as RouterStateSnapshot;
    return editorLeaveGuard(page, route, state, state);
  }
});
