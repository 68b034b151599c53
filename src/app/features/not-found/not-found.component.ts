import { ChangeDetectionStrategy, Component } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { RouterLink } from '@angular/router';

/** Any address the app does not know, or a workspace the user is not a member of. */
@Component({
  selector: 'cw-not-found',
  imports: [RouterLink, MatButtonModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="cw-page-narrow">
      <p class="cw-code" aria-hidden="true">404</p>
      <h1>Nothing at this address</h1>
      <p>
        The page does not exist, or it belongs to a workspace you are not a member of. A workspace
        owner can add you.
      </p>
      <a mat-flat-button routerLink="/">Go to my chains</a>
    </section>
  `,
  styles: `
    .cw-code {
      font: var(--mat-sys-display-large);
      color: var(--mat-sys-tertiary);
      margin: 0;
    }
  `,
})
export default class NotFoundComponent {}
