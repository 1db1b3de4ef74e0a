import type { CanDeactivateFn } from '@angular/router';
import type { Observable } from 'rxjs';

/** A page that may hold unsaved work and asks before it is left. */
export interface LeavesSafely {
  canLeave(): Observable<boolean>;
}

/** Route guard: leaving asks first when the page has unsaved changes. */
export const leaveSafely: CanDeactivateFn<LeavesSafely> = (page) => page.canLeave();
