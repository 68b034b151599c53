import { ChangeDetectionStrategy, Component } from '@angular/core';
import { MatCardModule } from '@angular/material/card';

/**
 * The narrow card every account page sits in (sign-in, registration, password links,
 * invitations): the page projects its heading, text and form into it.
 */
@Component({
  selector: 'cw-auth-card',
  imports: [MatCardModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="cw-page-narrow">
      <mat-card appearance="outlined" class="cw-auth-card">
        <mat-card-content><ng-content /></mat-card-content>
      </mat-card>
    </section>
  `,
  styles: `
    :host {
      display: block;
    }
    .cw-auth-card {
      padding: 8px 8px 16px;
    }
  `,
})
export class AuthCardComponent {}
