import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { tensionWord } from '../tension-words';

/**
 * A bar's tension under its stave: a meter filled from the left in proportion to the bar's
 * tension on the card's own scale (0 the calmest bar the card allows … 1 the tensest), the scale
 * the card's targets are read on, and, when the card sets a curve, a dashed mark at the target.
 * The printed numbers give both the measure's own value and the value on the card's scale.
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
  /** The same on the card's own scale (see `onCardScale`), or null when it allows one tension. */
  readonly onScale = input<number | null>(null);
  /** Target from the card's tension curve, 0..1, or null when the card sets none. */
  readonly target = input<number | null>(null);

  /** Widths in the meter's 0..100 units. */
  protected readonly measuredWidth = computed(() => clamp(this.onScale() ?? this.tension()) * 100);
  protected readonly scaleText = computed(() => {
    const onScale = this.onScale();
    return onScale === null ? null : onScale.toFixed(2);
  });
  protected readonly targetX = computed(() => {
    const target = this.target();
    // Kept a hair inside the ends so a target of 0 or 1 stays visible (and never reads as "none").
    return target === null ? null : Math.min(99.5, Math.max(0.5, clamp(target) * 100));
  });
  protected readonly tensionText = computed(() => this.tension().toFixed(2));
  protected readonly word = computed(() => tensionWord(this.tension()));
  protected readonly targetText = computed(() => {
    const target = this.target();
    return target === null ? null : target.toFixed(2);
  });
  protected readonly description = computed(() => {
    const target = this.targetText();
    const scale = this.scaleText();
    const base = `Bar ${this.bar()}: tension ${this.tensionText()} (${this.word()})${scale === null ? '' : `, ${scale} on this card's scale`}`;
    return target === null ? base : `${base}, target ${target}`;
  });
}

function clamp(value: number): number {
  return Math.min(1, Math.max(0, value));
}
