import { provideHttpClient, withFetch, withInterceptors } from '@angular/common/http';
import {
  ApplicationConfig,
  ErrorHandler,
  provideBrowserGlobalErrorListeners,
  provideZonelessChangeDetection,
} from '@angular/core';
import { MAT_DIALOG_DEFAULT_OPTIONS, MatDialogConfig } from '@angular/material/dialog';
import {
  MAT_FORM_FIELD_DEFAULT_OPTIONS,
  MatFormFieldDefaultOptions,
} from '@angular/material/form-field';
import { MAT_SNACK_BAR_DEFAULT_OPTIONS, MatSnackBarConfig } from '@angular/material/snack-bar';
import { MAT_TOOLTIP_DEFAULT_OPTIONS, MatTooltipDefaultOptions } from '@angular/material/tooltip';
import {
  provideRouter,
  withComponentInputBinding,
  withInMemoryScrolling,
  withRouterConfig,
} from '@angular/router';
import { appRoutes } from './app.routes';
import { AppErrorHandler } from './core/errors/app-error-handler';
import { csrfInterceptor } from './core/http/csrf.interceptor';
import { errorInterceptor } from './core/http/error.interceptor';
import { loadingInterceptor } from './core/http/loading.interceptor';
import { provideAppIcons } from './core/theme/icons';

/** Every app-wide provider in one place. */
export const appConfig: ApplicationConfig = {
  providers: [
    provideZonelessChangeDetection(),
    provideBrowserGlobalErrorListeners(),
    { provide: ErrorHandler, useClass: AppErrorHandler },
    provideRouter(
      appRoutes,
      withComponentInputBinding(),
      withInMemoryScrolling({ scrollPositionRestoration: 'enabled' }),
      withRouterConfig({ paramsInheritanceStrategy: 'always' }),
    ),
    // Order matters: the loading bar sees every request; the CSRF token is added before the
    // error interceptor so a retried request is reported once.
    provideHttpClient(
      withFetch(),
      withInterceptors([loadingInterceptor, errorInterceptor, csrfInterceptor]),
    ),
    provideAppIcons(),
    {
      provide: MAT_FORM_FIELD_DEFAULT_OPTIONS,
      // Required fields are the rule in this app; optional ones say so in their label.
      useValue: {
        appearance: 'outline',
        hideRequiredMarker: true,
      } satisfies MatFormFieldDefaultOptions,
    },
    {
      provide: MAT_SNACK_BAR_DEFAULT_OPTIONS,
      // Start from Material's own defaults: a partial object would drop the rest of them.
      useValue: { ...new MatSnackBarConfig(), duration: 6000, politeness: 'assertive' },
    },
    {
      provide: MAT_DIALOG_DEFAULT_OPTIONS,
      // From Material's defaults too: without them the dialog loses role="dialog" and aria-modal.
      useValue: {
        ...new MatDialogConfig(),
        autoFocus: 'first-tabbable',
        restoreFocus: true,
        maxWidth: '95vw',
      },
    },
    {
      provide: MAT_TOOLTIP_DEFAULT_OPTIONS,
      useValue: {
        showDelay: 400,
        hideDelay: 0,
        touchendHideDelay: 1000,
      } satisfies MatTooltipDefaultOptions,
    },
  ],
};
