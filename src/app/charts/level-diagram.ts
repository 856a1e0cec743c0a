import { ChangeDetectionStrategy, Component, ElementRef, ViewEncapsulation, afterRenderEffect, computed, input, output, viewChild } from '@angular/core';
import { axisLeft, scaleBand, scaleLinear, select } from 'd3';
import type { NodeLevel } from '@shared/contracts/figures';
import { ChartExportMenu } from './chart-export-menu';
import type { ChartTable } from './chart-export';
import { axisTickFormat } from './chart-format';
import { observeWidth } from './chart-size';

const MARGIN = { top: 40, right: 16, bottom: 52, left: 64 };

/**
 * The level at every node: the swing the node allows as a band, the signal's centre and its peak
 * excursion inside it. The node closest to clipping is named; a node that clips is drawn in the
 * alarm colour. Clicking a node picks its stage.
 */
@Component({
  selector: 'qb-level-diagram',
  imports: [ChartExportMenu],
  templateUrl: './level-diagram.html',
  styleUrl: './charts.scss',
  encapsulation: ViewEncapsulation.None,
  host: { class: 'qb-chart-host' },
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class LevelDiagram {
  readonly levels = input.required<readonly NodeLevel[]>();
  readonly closestToClipping = input<string | null>(null);
  readonly highlight = input<string | null>(null);
  readonly fileName = input('levels');
  readonly chartTitle = input('');
  readonly height = input(320);
  readonly nodePicked = output<string>();

  private readonly svgRef = viewChild.required<ElementRef<SVGSVGElement>>('svg');
  private readonly axisRef = viewChild.required<ElementRef<SVGGElement>>('axis');

  protected readonly width = observeWidth();
  protected readonly margin = MARGIN;
  protected readonly svgElement = computed(() => this.svgRef().nativeElement);
  protected readonly innerWidth = computed(() => Math.max(40, this.width() - MARGIN.left - MARGIN.right));
  protected readonly innerHeight = computed(() => Math.max(40, this.height() - MARGIN.top - MARGIN.bottom));

  private readonly y = computed(() => {
    let low = Infinity;
    let high = -Infinity;
    for (const level of this.levels()) {
      low = Math.min(low, level.centre - level.peak, level.swingLow ?? Infinity);
      high = Math.max(high, level.centre + level.peak, level.swingHigh ?? -Infinity);
    }
    const domain: [number, number] = Number.isFinite(low) && Number.isFinite(high) && high > low ? [low, high] : [0, 5];
    return scaleLinear().domain(domain).range([this.innerHeight(), 0]).nice();
  });

  protected readonly nodes = computed(() => {
    const x = scaleBand<string>()
      .domain(this.levels().map((level) => level.node))
      .range([0, this.innerWidth()])
      .paddingInner(0.3)
      .paddingOuter(0.15);
    const y = this.y();
    const band = x.bandwidth();
    const spanWidth = band * 0.5;
    const closest = this.closestToClipping();
    const highlight = this.highlight();
    return this.levels().map((level) => {
      const left = x(level.node) ?? 0;
      const top = y(level.centre + level.peak);
      const bottom = y(level.centre - level.peak);
      const hasSwing = level.swingLow !== null && level.swingHigh !== null;
      return {
        node: level.node,
        kind: level.kind,
        domain: level.domain,
        closest: level.node === closest,
        clipping: (level.usedFraction ?? 0) > 1,
        highlighted: level.node === highlight,
        left,
        band,
        middle: left + band / 2,
        swing: hasSwing ? { y: y(level.swingHigh as number), height: y(level.swingLow as number) - y(level.swingHigh as number) } : null,
        span: { x: left + (band - spanWidth) / 2, width: spanWidth, y: top, height: Math.max(1, bottom - top) },
        centre: y(level.centre),
        used: level.usedFraction === null ? '' : `${Math.round(level.usedFraction * 100)} %`,
        summary: describe(level),
      };
    });
  });

  protected readonly table = computed<ChartTable>(() => ({
    columns: ['node', 'kind', 'domain', 'centre [V]', 'peak [V]', 'signal low [V]', 'signal high [V]', 'swing low [V]', 'swing high [V]', 'used fraction'],
    rows: this.levels().map((level) => [
      level.node,
      level.kind,
      level.domain,
      level.centre,
      level.peak,
      level.centre - level.peak,
      level.centre + level.peak,
      level.swingLow,
      level.swingHigh,
      level.usedFraction,
    ]),
  }));

  constructor() {
    afterRenderEffect(() => {
      const ticks = Math.max(2, Math.round(this.innerHeight() / 50));
      select(this.axisRef().nativeElement).call(axisLeft(this.y()).ticks(ticks).tickFormat(axisTickFormat(this.y(), ticks)));
    });
  }

  protected pickNode(node: string): void {
    this.nodePicked.emit(node);
  }
}

function describe(level: NodeLevel): string {
  const volts = (value: number) => `${Number(value.toPrecision(3))} V`;
  const swing = level.swingLow === null || level.swingHigh === null ? 'no swing limit' : `swing ${volts(level.swingLow)} to ${volts(level.swingHigh)}`;
  const used = level.usedFraction === null ? '' : `, ${Math.round(level.usedFraction * 100)} % used`;
  return `${level.node} (${level.kind}, ${level.domain}): ${volts(level.centre)} ± ${volts(level.peak)}, ${swing}${used}`;
}
