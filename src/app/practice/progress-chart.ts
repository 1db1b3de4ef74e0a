import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { ChartConfiguration } from 'chart.js';
import { BaseChartDirective, provideCharts, withDefaultRegisterables } from 'ng2-charts';
import type { Progress } from './practice-api';

/** Line colours per student, told apart by point style too (not by colour alone). */
const COLOURS = ['#3b3f8f', '#b4552d', '#2f7d5b', '#8a3f8f', '#6b6b22'];
const POINTS = ['circle', 'rect', 'triangle', 'rectRot', 'star'] as const;

/**
 * Two charts: the highest clean tempo of each session over time (one line per student) and the
 * minutes practised per week. Chart.js comes with this component only, which its users load
 * with `@defer`, so it stays out of every other page's bundle.
 */
@Component({
  selector: 'tensile-progress-chart',
  imports: [BaseChartDirective],
  providers: [provideCharts(withDefaultRegisterables())],
  template: `
    @if (progress().tempo.length === 0) {
      <p class="empty">No practice logged yet: the charts fill in as sessions are logged.</p>
    } @else {
      <figure>
        <figcaption>Highest clean tempo per session (BPM)</figcaption>
        <div class="frame">
          <canvas baseChart type="line" [data]="tempoData()" [options]="tempoOptions()"></canvas>
        </div>
      </figure>
      <figure>
        <figcaption>
          Minutes practised per week (weeks start Monday 00:00 UTC; days are UTC days)
        </figcaption>
        <div class="frame">
          <canvas baseChart type="bar" [data]="minutesData()" [options]="barOptions"></canvas>
        </div>
      </figure>
    }
  `,
  styles: `
    :host {
      display: grid;
      gap: 16px;
      grid-template-columns: repeat(auto-fit, minmax(300px, 1fr));
    }
    figure {
      margin: 0;
    }
    figcaption {
      font: var(--mat-sys-title-small);
      margin-bottom: 8px;
    }
    .frame {
      position: relative;
      height: 240px;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ProgressChart {
  readonly progress = input.required<Progress>();
  /** Names for the students' lines; one unnamed line when absent. */
  readonly names = input<Readonly<Record<number, string>>>({});
  readonly targetTempo = input<number | null>(null);

  protected readonly tempoData = computed<ChartConfiguration<'line'>['data']>(() => {
    const points = this.progress().tempo;
    const labels = [...new Set(points.map((p) => p.practisedAt.slice(0, 10)))].sort();
    const students = [...new Set(points.map((p) => p.studentId))];
    const names = this.names();
    const datasets: ChartConfiguration<'line'>['data']['datasets'] = students.map((id, i) => {
      // The best tempo of each day, so two sessions in a day make one point.
      const best = new Map<string, number>();
      for (const p of points.filter((x) => x.studentId === id)) {
        const day = p.practisedAt.slice(0, 10);
        best.set(day, Math.max(best.get(day) ?? 0, p.tempo));
      }
      return {
        label: names[id] ?? 'Clean tempo',
        data: labels.map((day) => best.get(day) ?? null),
        spanGaps: true,
        borderColor: COLOURS[i % COLOURS.length],
        backgroundColor: COLOURS[i % COLOURS.length],
        pointStyle: POINTS[i % POINTS.length],
        tension: 0.2,
      };
    });
    const target = this.targetTempo();
    if (target !== null) {
      datasets.push({
        label: `Target ${target} BPM`,
        data: labels.map(() => target),
        borderColor: '#777777',
        borderDash: [6, 4],
        pointRadius: 0,
      });
    }
    return { labels, datasets };
  });

  protected readonly tempoOptions = computed<ChartConfiguration<'line'>['options']>(() => ({
    maintainAspectRatio: false,
    animation: false,
    scales: { y: { title: { display: true, text: 'BPM' } } },
  }));

  protected readonly minutesData = computed<ChartConfiguration<'bar'>['data']>(() => {
    const weeks = this.progress().minutesPerWeek;
    return {
      labels: weeks.map((w) => w.weekStart),
      datasets: [
        { label: 'Minutes', data: weeks.map((w) => w.minutes), backgroundColor: COLOURS[0] },
      ],
    };
  });

  protected readonly barOptions: ChartConfiguration<'bar'>['options'] = {
    maintainAspectRatio: false,
    animation: false,
    plugins: { legend: { display: false } },
    scales: { y: { beginAtZero: true, title: { display: true, text: 'minutes' } } },
  };
}
