import { ChangeDetectionStrategy, Component } from '@angular/core';
import { ShellComponent } from './core/layout/shell.component';

/** The root: everything lives inside the shell. */
@Component({
  selector: 'cw-root',
  imports: [ShellComponent],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: '<cw-shell />',
  styles: ':host { display: block; height: 100%; }',
})
export class AppComponent {}
