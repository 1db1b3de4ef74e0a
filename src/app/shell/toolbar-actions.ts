import {
  afterNextRender,
  ChangeDetectionStrategy,
  Component,
  computed,
  ElementRef,
  inject,
  input,
  output,
  viewChild,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDividerModule } from '@angular/material/divider';
import { MatMenuModule, MatMenuTrigger } from '@angular/material/menu';
import { MatTooltipModule } from '@angular/material/tooltip';

import { ThemePreference } from '../core/theme-preference';
import type { SessionUser } from '../core/user';

/** Which of the toolbar's buttons was pressed. */
export type ToolbarButton = 'theme' | 'account';

/**
 * The toolbar's theme toggle (with its tooltip) and account menu. The shell loads them once the
 * page is idle, so the menu, the tooltip and the overlay they share stay off a page's first
 * path; until then it shows buttons that look the same (see the shell's template).
 */
@Component({
  selector: 'tensile-toolbar-actions',
  imports: [MatButtonModule, MatDividerModule, MatMenuModule, MatTooltipModule],
  templateUrl: './toolbar-actions.html',
  styleUrl: './toolbar-actions.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { class: 'toolbar-actions' },
})
export class ToolbarActions {
  readonly person = input<SessionUser | null>(null);
  readonly roleLabel = input('');
  /** Pressed before this loaded: that button takes the focus, the account one opens its menu. */
  readonly pressed = input<ToolbarButton | null>(null);
  readonly signOut = output();

  private readonly theme = inject(ThemePreference);
  private readonly trigger = viewChild(MatMenuTrigger);
  private readonly themeButton = viewChild.required<ElementRef<HTMLButtonElement>>('themeButton');
  protected readonly darkScheme = computed(() => this.theme.effective() === 'dark');

  constructor() {
    afterNextRender(() => {
      const trigger = this.trigger();
      if (this.pressed() === 'theme') this.themeButton().nativeElement.focus();
      if (this.pressed() !== 'account' || !trigger) return;
      trigger.focus();
      trigger.openMenu();
    });
  }

  protected toggleColorScheme(): void {
    this.theme.toggle();
  }
}
