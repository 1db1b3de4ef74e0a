import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';

/**
 * A bar's tension under its stave: a meter filled from the left in proportion to the measured
 * value (0 calm … 1 most syncopated) and, when the card sets a curve, a dashed mark at the target.
 * Shape and printed numbers carry the values; colour only supports them.
 */
@Component({
  selector: 'tensile-tension-plot',
  templateUrl: './tension-plot.html',
  styleUrl: './tension-plot.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: {
    role: 'img',
    '[attr.aria-label]': 'description()',
    '[attr.title]': 'description()',
  },
})
export class TensionPlot {
  readonly bar = input.required<number>();
  /** Measured tension of the bar, 0..1. */
  readonly tension = input.required<number>();
  /** Target from the card's tension curve, 0..1, or null when the card sets none. */
  readonly target = input<number | null>(null);

  /** Widths in the meter's 0..100 units. */
  protected readonly measuredWidth = computed(() => clamp(this.tension()) * 100);
  protected readonly targetX = computed(() => {
    const target = this.target();
    // Kept a hair inside the ends so a target of 0 or 1 stays visible (and never reads as "none").
    return target === null ? null : Math.min(99.5, Math.max(0.5, clamp(target) * 100));
  });
  protected readonly tensionText = computed(() => this.tension().toFixed(2));
  protected readonly targetText = computed(() => {
    const target = this.target();
    return target === null ? null : target.toFixed(2);
  });
  protected readonly description = computed(() => {
    const target = this.targetText();
    const base = `Bar ${this.bar()}: tension ${this.tensionText()}`;
    return target === null ? base : `${base}, target ${target}`;
  });
}

function clamp(value: number): number {
  return Math.min(1, Math.max(0, value));
}
