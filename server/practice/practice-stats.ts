/** Pure figures over practice logs: streaks, minutes per week, status of an assignment. */

/** The calendar day (UTC) of a moment, `YYYY-MM-DD`. */
export function dayOf(moment: Date | string): string {
  return new Date(moment).toISOString().slice(0, 10);
}

function addDays(day: string, days: number): string {
  const date = new Date(`${day}T00:00:00Z`);
  date.setUTCDate(date.getUTCDate() + days);
  return date.toISOString().slice(0, 10);
}

/**
 * Days in a row with practice, counted back from today, or from yesterday when today has no
 * practice yet (a streak is not lost before the day is over).
 */
export function practiceStreak(days: ReadonlySet<string>, today: string): number {
  let day = days.has(today) ? today : addDays(today, -1);
  let streak = 0;
  while (days.has(day)) {
    streak += 1;
    day = addDays(day, -1);
  }
  return streak;
}

/** The Monday (UTC) that starts the ISO week of a day. */
export function weekStart(day: string): string {
  const weekday = new Date(`${day}T00:00:00Z`).getUTCDay(); // 0 = Sunday
  return addDays(day, -((weekday + 6) % 7));
}

/** Minutes summed per ISO week, every week from the first to the last log (empty weeks 0). */
export function minutesPerWeek(
  logs: readonly { readonly practisedAt: string; readonly minutes: number }[],
): { weekStart: string; minutes: number }[] {
  if (logs.length === 0) return [];
  const totals = new Map<string, number>();
  for (const log of logs) {
    const week = weekStart(dayOf(log.practisedAt));
    totals.set(week, (totals.get(week) ?? 0) + log.minutes);
  }
  const weeks = [...totals.keys()].sort();
  const result: { weekStart: string; minutes: number }[] = [];
  for (let week = weeks[0]!; week <= weeks[weeks.length - 1]!; week = addDays(week, 7)) {
    result.push({ weekStart: week, minutes: totals.get(week) ?? 0 });
  }
  return result;
}

/** Where a student stands on an assignment. */
export type AssignmentStatus = 'not_started' | 'practising' | 'target_reached' | 'overdue';

/**
 * Target reached wins over overdue (late but done); overdue is a due date before today without
 * the target; otherwise practising once anything is logged.
 */
export function assignmentStatus(input: {
  readonly bestTempo: number | null;
  readonly targetTempo: number;
  readonly dueDate: string;
  readonly today: string;
}): AssignmentStatus {
  if (input.bestTempo !== null && input.bestTempo >= input.targetTempo) return 'target_reached';
  if (input.dueDate < input.today) return 'overdue';
  return input.bestTempo === null ? 'not_started' : 'practising';
}
