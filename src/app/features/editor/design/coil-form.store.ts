import { Injectable, signal } from '@angular/core';
import { DEFAULT_COIL_FORM, type CoilForm } from '../../../../../shared/engine/design/coil-winding';

/** The air-core coil form the editor winds inductors on (turns shown beside every inductor). */
@Injectable({ providedIn: 'root' })
export class CoilFormStore {
  readonly form = signal<CoilForm>(DEFAULT_COIL_FORM);
}
