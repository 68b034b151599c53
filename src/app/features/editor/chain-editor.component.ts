import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { RouterLink } from '@angular/router';

/** Stand-in for the chain editor so the route resolves until the editor lands here. */
@Component({
  selector: 'cw-chain-editor',
  imports: [RouterLink],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="cw-page">
      <h1>Chain</h1>
      <p>The editor for chain {{ chainId() }} is on its way.</p>
      <a [routerLink]="['/w', workspaceId(), 'chains']">Back to the chain list</a>
    </section>
  `,
})
export default class ChainEditorComponent {
  readonly workspaceId = input.required<string>();
  readonly chainId = input.required<string>();
}
