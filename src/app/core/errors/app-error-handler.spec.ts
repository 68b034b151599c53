import { HttpErrorResponse } from '@angular/common/http';
import { TestBed } from '@angular/core/testing';
import { MatSnackBar } from '@angular/material/snack-bar';
import { AppErrorHandler } from './app-error-handler';

describe('AppErrorHandler', () => {
  let handler: AppErrorHandler;
  let snackBar: { open: jest.Mock };
  let logged: jest.SpyInstance;

  beforeEach(() => {
    snackBar = { open: jest.fn() };
    TestBed.configureTestingModule({
      providers: [AppErrorHandler, { provide: MatSnackBar, useValue: snackBar }],
    });
    handler = TestBed.inject(AppErrorHandler);
    // Replaces the setup's throwing console.error: here logging is the behaviour under test.
    logged = jest.spyOn(console, 'error').mockImplementation(() => undefined);
  });

  it('should tell the user in plain words when the client itself fails', () => {
    handler.handleError(new TypeError('x is undefined'));
    expect(logged).toHaveBeenCalledWith(expect.any(TypeError));
    expect(snackBar.open.mock.calls[0][0]).toMatch(/Reload it; your saved work is safe/);
  });

  it('should not report an HTTP failure twice', () => {
    const warn = jest.spyOn(console, 'warn').mockImplementation(() => undefined);
    handler.handleError({ rejection: new HttpErrorResponse({ status: 500, url: '/api/x' }) });
    expect(snackBar.open).not.toHaveBeenCalled();
    expect(logged).not.toHaveBeenCalled();
    expect(warn).toHaveBeenCalledWith('Unhandled HTTP error', 500, '/api/x');
  });
});
