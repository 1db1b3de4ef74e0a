import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { CardEditorStore, typedNumber } from './card-editor-store';

/** Plot size in SVG units; the plot scales to its box. */
const WIDTH = 320;
const HEIGHT = 120;
const PAD = 14;

/**
 * A tension curve edited by dragging its points (one per bar, repeated over the drill), with a
 * number field per point for keyboard users. A drag is one undo step.
 */
@Component({
  selector: 'tensile-tension-curve',
  imports: [MatButtonModule, MatFormFieldModule, MatInputModule],
  templateUrl: './tension-curve.html',
  styleUrl: './tension-curve.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class TensionCurve {
  /** Index of the tension rule in the card's rules. */
  readonly rule = input.required<number>();

  protected readonly store = inject(CardEditorStore);
  protected readonly width = WIDTH;
  protected readonly height = HEIGHT;
  protected readonly dragging = signal<number | null>(null);
  private dragId = 0;

  protected readonly curve = computed<unknown[]>(() => {
    const rule = this.store.card().rules?.[this.rule()];
    return rule?.kind === 'tension' && Array.isArray(rule.curve) ? rule.curve : [];
  });
  protected readonly bars = computed(() => this.store.card().bars ?? 4);
  protected readonly points = computed(() => {
    const curve = this.curve();
    const step = curve.length > 1 ? (WIDTH - 2 * PAD) / (curve.length - 1) : 0;
    return curve.map((value, i) => {
      const v = typeof value === 'number' && Number.isFinite(value) ? clamp(value) : 0;
      return { i, value, x: curve.length > 1 ? PAD + i * step : WIDTH / 2, y: toY(v) };
    });
  });
  protected readonly line = computed(() =>
    this.points()
      .map((p) => `${p.x},${p.y}`)
      .join(' '),
  );

  protected issues(i: number): string[] {
    return this.store.issues(`rules[${this.rule()}].curve[${i}]`);
  }

  protected curveIssues(): string[] {
    const path = `rules[${this.rule()}].curve`;
    return this.store
      .issues(path)
      .filter((m) => !this.curve().some((_, i) => this.issues(i).includes(m)));
  }

  protected errorState(i: number) {
    return this.store.errorState(`rules[${this.rule()}].curve[${i}]`);
  }

  protected startDrag(event: PointerEvent, i: number): void {
    event.preventDefault();
    (event.target as Element).setPointerCapture?.(event.pointerId);
    this.dragId += 1;
    this.dragging.set(i);
  }

  protected drag(event: PointerEvent): void {
    const i = this.dragging();
    if (i === null) return;
    const svg = (event.currentTarget as SVGSVGElement).getBoundingClientRect();
    const y = ((event.clientY - svg.top) / svg.height) * HEIGHT;
    const value = Math.round(clamp((HEIGHT - PAD - y) / (HEIGHT - 2 * PAD)) * 100) / 100;
    this.setPoint(i, value, `curve-drag-${this.dragId}`);
  }

  protected endDrag(): void {
    this.dragging.set(null);
  }

  /** Arrow keys on a focused point nudge it by 0.05 (one undo step per key). */
  protected nudge(event: KeyboardEvent, i: number): void {
    const delta = event.key === 'ArrowUp' ? 0.05 : event.key === 'ArrowDown' ? -0.05 : 0;
    if (delta === 0) return;
    event.preventDefault();
    const current = this.curve()[i];
    const base = typeof current === 'number' ? current : 0;
    this.setPoint(i, Math.round(clamp(base + delta) * 100) / 100);
  }

  protected typed(i: number, text: Event): void {
    this.setPoint(i, typedNumber(text), `curve-${this.rule()}-${i}`);
  }

  /** One target per bar of the card. */
  protected matchBars(): void {
    const bars = Math.min(64, this.bars());
    this.edit((curve) =>
      Array.from({ length: bars }, (_, i) => curve[i % Math.max(1, curve.length)] ?? 0.5),
    );
  }

  protected addPoint(): void {
    this.edit((curve) => (curve.length < 64 ? [...curve, curve.at(-1) ?? 0.5] : curve));
  }

  protected removePoint(): void {
    this.edit((curve) => (curve.length > 1 ? curve.slice(0, -1) : curve));
  }

  private setPoint(i: number, value: number | undefined, group: string | null = null): void {
    this.store.edit((card) => {
      const rule = card.rules?.[this.rule()];
      if (rule?.kind === 'tension') rule.curve[i] = value as number;
    }, group);
  }

  private edit(change: (curve: number[]) => number[]): void {
    this.store.edit((card) => {
      const rule = card.rules?.[this.rule()];
      if (rule?.kind === 'tension') rule.curve = change(rule.curve);
    });
  }
}

function clamp(value: number): number {
  return Math.min(1, Math.max(0, value));
}

function toY(value: number): number {
  return HEIGHT - PAD - value * (HEIGHT - 2 * PAD);
}
