import { HttpContext } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, inject, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { Router, RouterLink } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import { ColleaguesApi } from '../../core/api/colleagues.api';
import { SKIP_ERROR_SNACKBAR } from '../../core/http/http-context';
import { SessionStore } from '../../core/session/session.store';
import { AuthCardComponent } from '../auth/parts/auth-card.component';
import { Submission } from '../auth/parts/submission';

/** Opens the link from the confirmation mail: the account is created and signed in. */
@Component({
  selector: 'cw-confirm-address',
  imports: [RouterLink, MatButtonModule, AuthCardComponent],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <cw-auth-card>
      <h1>Confirm your address</h1>
      @if (submission.failure(); as text) {
        <p class="cw-form-error" role="alert">{{ text }}</p>
        <p><a routerLink="/register">Sign up again</a> · <a routerLink="/sign-in">Sign in</a></p>
      } @else {
        <p>Open your account by confirming that this address is yours.</p>
        <div class="cw-actions">
          <button mat-flat-button type="button" [disabled]="submission.busy()" (click)="confirm()">
            Confirm and sign in
          </button>
        </div>
      }
    </cw-auth-card>
  `,
  styleUrl: '../auth/auth-page.scss',
})
export default class ConfirmAddressComponent {
  private readonly api = inject(ColleaguesApi);
  private readonly session = inject(SessionStore);
  private readonly router = inject(Router);
  /** From the route. */
  readonly token = input.required<string>();
  protected readonly submission = new Submission();

  // A button rather than on load: mail scanners that open links must not use up the link.
  protected async confirm(): Promise<void> {
    await this.submission.run(async () => {
      const context = new HttpContext().set(SKIP_ERROR_SNACKBAR, [404, 409, 429]);
      const answer = await firstValueFrom(this.api.confirmAddress(this.token(), context));
      await this.session.startSession(answer);
      await this.router.navigateByUrl('/');
    });
  }
}
