import { ChangeDetectionStrategy, Component } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { RouterLink } from '@angular/router';

/** Shown for any address Tensile does not know; works signed in or out. */
@Component({
  selector: 'tensile-not-found',
  imports: [MatButtonModule, RouterLink],
  template: `
    <main id="main-content" class="tensile-page not-found" tabindex="-1">
      <p class="brand">Tensile</p>
      <h1>Page not found</h1>
      <p class="tensile-lede">
        There is no page at this address. Check the link, or go back to your home page.
      </p>
      <a mat-flat-button routerLink="/">Go to your home page</a>
    </main>
  `,
  styles: `
    .not-found {
      padding-top: 15vh;
      text-align: center;
    }
    .not-found .tensile-lede {
      margin-inline: auto;
    }
    .brand {
      font: var(--mat-sys-title-medium);
      color: var(--tensile-primary);
      letter-spacing: 0.08em;
      text-transform: uppercase;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class NotFound {}
