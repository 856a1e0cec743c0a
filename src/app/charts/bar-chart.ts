import { ChangeDetectionStrategy, Component, ElementRef, ViewEncapsulation, afterRenderEffect, computed, input, viewChild } from '@angular/core';
import { axisBottom, max, min, scaleBand, scaleLinear, select } from 'd3';
import { ChartExportMenu } from './chart-export-menu';
import type { ChartTable } from './chart-export';
import { axisTickFormat, siTick } from './chart-format';
import { observeWidth } from './chart-size';
import type { BarDatum } from './chart-types';

const BAR_PITCH = 28;
const MARGIN = { top: 30, right: 72, bottom: 44 };

/** Horizontal bars with their values written at the ends, e.g. each noise source's share. */
@Component({
  selector: 'qb-bar-chart',
  imports: [ChartExportMenu],
  templateUrl: './bar-chart.html',
  styleUrl: './charts.scss',
  encapsulation: ViewEncapsulation.None,
  host: { class: 'qb-chart-host' },
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class BarChart {
  readonly bars = input.required<readonly BarDatum[]>();
  /** What the values are, with their unit: the axis label and the CSV column. */
  readonly valueLabel = input('');
  readonly format = input<(value: number) => string>(siTick);
  readonly fileName = input('chart');
  readonly chartTitle = input('');

  private readonly svgRef = viewChild.required<ElementRef<SVGSVGElement>>('svg');
  private readonly axisRef = viewChild.required<ElementRef<SVGGElement>>('axis');

  protected readonly width = observeWidth();
  protected readonly margin = MARGIN;
  protected readonly svgElement = computed(() => this.svgRef().nativeElement);
  /** Room for the longest label, within reason. */
  protected readonly left = computed(() => Math.min(240, 16 + 6.5 * (max(this.bars(), (bar) => bar.label.length) ?? 4)));
  protected readonly innerWidth = computed(() => Math.max(40, this.width() - this.left() - MARGIN.right));
  protected readonly innerHeight = computed(() => Math.max(BAR_PITCH, this.bars().length * BAR_PITCH));
  protected readonly height = computed(() => this.innerHeight() + MARGIN.top + MARGIN.bottom);

  private readonly x = computed(() => {
    const values = this.bars().map((bar) => bar.value).filter(Number.isFinite);
    const low = Math.min(0, min(values) ?? 0);
    const high = Math.max(0, max(values) ?? 1);
    return scaleLinear()
      .domain(low === high ? [0, 1] : [low, high])
      .range([0, this.innerWidth()])
      .nice();
  });

  private readonly y = computed(() =>
    scaleBand<number>()
      .domain(this.bars().map((_, index) => index))
      .range([0, this.innerHeight()])
      .padding(0.25),
  );

  protected readonly marks = computed(() => {
    const x = this.x();
    const y = this.y();
    const format = this.format();
    const zero = x(0);
    return this.bars().map((bar, index) => {
      const value = Number.isFinite(bar.value) ? bar.value : 0;
      const end = x(value);
      return {
        label: bar.label,
        detail: bar.detail ?? `${bar.label}: ${format(bar.value)}`,
        x: Math.min(zero, end),
        y: y(index) ?? 0,
        width: Math.abs(end - zero),
        height: y.bandwidth(),
        text: format(bar.value),
        textX: value < 0 ? Math.min(zero, end) - 4 : Math.max(zero, end) + 4,
        anchor: value < 0 ? 'end' : 'start',
        middle: (y(index) ?? 0) + y.bandwidth() / 2,
      };
    });
  });

  protected readonly table = computed<ChartTable>(() => ({
    columns: ['label', this.valueLabel() || 'value', 'detail'],
    rows: this.bars().map((bar) => [bar.label, bar.value, bar.detail ?? null]),
  }));

  constructor() {
    afterRenderEffect(() => {
      const ticks = Math.max(2, Math.round(this.innerWidth() / 90));
      select(this.axisRef().nativeElement).call(axisBottom(this.x()).ticks(ticks).tickFormat(axisTickFormat(this.x(), ticks)));
    });
  }
}
