import { ChangeDetectionStrategy, Component } from '@angular/core';

/** A short practice-safety caution, deferring to a qualified person; shown in the shell footer. */
@Component({
  selector: 'tensile-safety-note',
  template: `
    <p class="safety-note">
      <span class="material-icons" aria-hidden="true">health_and_safety</span>
      <span>
        Practise with hearing protection, take breaks, keep a relaxed posture; a qualified teacher
        or clinician is the right person for pain or discomfort.
      </span>
    </p>
  `,
  styles: `
    .safety-note {
      display: flex;
      gap: 8px;
      align-items: flex-start;
      margin: 0;
      font: var(--mat-sys-body-small);
      color: var(--tensile-ink-muted);
    }
    .material-icons {
      font-size: 18px;
      color: var(--tensile-accent);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SafetyNote {}
