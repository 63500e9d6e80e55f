import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import { METHODS, VALIDATION_SUITES } from '@laminote/aero';
import { ENGINE_CAUTION, ENGINE_VERSION } from '@laminote/aero';
import { NotFound } from '../shared/not-found';
import { Tex } from './tex';

/**
 * The engine's methods in the open: the list of methods, and one method at a time with its formulas,
 * symbols and units, validity, sources and known limits, and the validation suites that check it.
 */
@Component({
  selector: 'lam-methods-page',
  imports: [MatIconModule, NotFound, RouterLink, Tex],
  templateUrl: './methods-page.html',
  styleUrl: './methods-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class MethodsPage {
  /** Route parameter; absent on /methods, which opens the first method. */
  readonly methodId = input<string | undefined>(undefined);

  protected readonly methods = METHODS;
  protected readonly engineVersion = ENGINE_VERSION;
  protected readonly caution = ENGINE_CAUTION;
  protected readonly method = computed(() => {
    const id = this.methodId();
    return id === undefined ? METHODS[0] : METHODS.find((m) => m.id === id);
  });
  protected readonly suites = computed(() => {
    const id = this.method()?.id;
    return VALIDATION_SUITES.filter((s) => id !== undefined && s.methods.includes(id));
  });
}
