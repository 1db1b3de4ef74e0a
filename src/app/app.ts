import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { RouterOutlet } from '@angular/router';

import { ThemePreference } from './core/theme-preference';

/** Root component: the router decides between the sign-in page and the signed-in shell. */
@Component({
  selector: 'tensile-root',
  imports: [RouterOutlet],
  template: '<router-outlet />',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class App {
  // Instantiated here so the saved scheme and the system listener are live on every page.
  protected readonly theme = inject(ThemePreference);
}
