/**
 * Undo and redo for one editing session: a list of snapshots and a cursor. Edits that share a
 * `group` key (keystrokes in one field) while nothing else happened in between fold into one step,
 * so undo takes back a whole typed value rather than one digit.
 */
export class CardHistory<T> {
  private readonly past: T[] = [];
  private readonly future: T[] = [];
  private lastGroup: string | null = null;

  constructor(private current: T) {}

  get value(): T {
    return this.current;
  }

  get canUndo(): boolean {
    return this.past.length > 0;
  }

  get canRedo(): boolean {
    return this.future.length > 0;
  }

  /** Record a new state; `group` folds consecutive edits of one field into one undo step. */
  push(next: T, group: string | null = null): void {
    if (group === null || group !== this.lastGroup) this.past.push(this.current);
    this.current = next;
    this.future.length = 0;
    this.lastGroup = group;
  }

  undo(): T {
    const previous = this.past.pop();
    if (previous !== undefined) {
      this.future.push(this.current);
      this.current = previous;
    }
    this.lastGroup = null;
    return this.current;
  }

  redo(): T {
    const next = this.future.pop();
    if (next !== undefined) {
      this.past.push(this.current);
      this.current = next;
    }
    this.lastGroup = null;
    return this.current;
  }
}
