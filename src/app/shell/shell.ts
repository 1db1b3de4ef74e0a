import { BreakpointObserver } from '@angular/cdk/layout';
import {
  ChangeDetectionStrategy,
  Component,
  computed,
  inject,
  signal,
  viewChild,
  ElementRef,
} from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatListModule } from '@angular/material/list';
import { MatSidenavModule } from '@angular/material/sidenav';
import { MatToolbarModule } from '@angular/material/toolbar';
import { Router, RouterLink, RouterLinkActive, RouterOutlet } from '@angular/router';
import { map } from 'rxjs';

import { AuthSession } from '../core/auth-session';
import { ThemePreference } from '../core/theme-preference';
import { ROLE_LABEL } from '../core/user';
import { SafetyNote } from '../ui/safety-note';
import { navigationFor } from './navigation';
import { ToolbarActions, type ToolbarButton } from './toolbar-actions';

/** Wide enough to keep the navigation open beside the page; narrower screens slide it over. */
export const WIDE_LAYOUT_QUERY = '(min-width: 1024px)';

/** The signed-in frame: toolbar, role-based navigation, page, and the safety footer. */
@Component({
  selector: 'tensile-shell',
  imports: [
    MatButtonModule,
    MatListModule,
    MatSidenavModule,
    MatToolbarModule,
    RouterLink,
    RouterLinkActive,
    RouterOutlet,
    SafetyNote,
    ToolbarActions,
  ],
  templateUrl: './shell.html',
  styleUrl: './shell.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class Shell {
  private readonly session = inject(AuthSession);
  private readonly router = inject(Router);
  private readonly theme = inject(ThemePreference);
  private readonly main = viewChild.required<ElementRef<HTMLElement>>('main');

  protected readonly user = this.session.user;
  protected readonly roleLabel = computed(() => {
    const role = this.session.role();
    return role ? ROLE_LABEL[role] : '';
  });
  protected readonly navigation = computed(() => navigationFor(this.session.role()));
  protected readonly wide = toSignal(
    inject(BreakpointObserver)
      .observe(WIDE_LAYOUT_QUERY)
      .pipe(map((state) => state.matches)),
    { initialValue: true },
  );
  /** Only meaningful on narrow screens; on wide screens the navigation is always open. */
  protected readonly navOpen = signal(false);
  protected readonly darkScheme = computed(() => this.theme.effective() === 'dark');
  /** A toolbar button pressed before the real ones loaded: they take its focus (and menu). */
  protected readonly pressed = signal<ToolbarButton | null>(null);

  protected toggleNavigation(): void {
    this.navOpen.update((open) => !open);
  }

  /** After choosing a page on a narrow screen, get the navigation out of the way. */
  protected closeNavigationIfNarrow(): void {
    if (!this.wide()) this.navOpen.set(false);
  }

  protected toggleColorScheme(): void {
    this.theme.toggle();
  }

  /** Moves focus past the toolbar and navigation, without touching the URL. */
  protected skipToContent(event: Event): void {
    event.preventDefault();
    this.main().nativeElement.focus();
  }

  protected signOut(): void {
    this.session.signOut().subscribe(() => void this.router.navigateByUrl('/sign-in'));
  }
}
