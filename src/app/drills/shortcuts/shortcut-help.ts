import { ChangeDetectionStrategy, Component } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialogModule } from '@angular/material/dialog';
import { DRILL_SHORTCUTS } from './shortcut-list';

/** The drill page's keyboard shortcuts, in a dialog opened by "?" or the Shortcuts button. */
@Component({
  selector: 'tensile-shortcut-help',
  imports: [MatButtonModule, MatDialogModule],
  templateUrl: './shortcut-help.html',
  styleUrl: './shortcut-help.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ShortcutHelp {
  protected readonly groups = DRILL_SHORTCUTS;
}
