import { ChangeDetectionStrategy, Component, ElementRef, ViewEncapsulation, afterRenderEffect, computed, input, output, signal, viewChild } from '@angular/core';
import { MatButton } from '@angular/material/button';
import { area, axisBottom, axisLeft, bisector, line, scaleLinear, scaleLog, select, zoom, zoomIdentity, type ScaleContinuousNumeric, type ZoomBehavior, type ZoomTransform } from 'd3';
import { ChartExportMenu } from './chart-export-menu';
import type { ChartTable } from './chart-export';
import { axisTickFormat, cursorValue } from './chart-format';
import { observeWidth } from './chart-size';
import type { AxisScale, ChartMarker, LineSeries, PickedPoint } from './chart-types';

type Scale = ScaleContinuousNumeric<number, number>;

/** A series with x ascending and only the points a scale can place. */
interface PreparedSeries {
  readonly name: string;
  readonly x: Float64Array;
  readonly y: Float64Array;
  readonly low: Float64Array | null;
  readonly high: Float64Array | null;
  /** Index in the caller's arrays of each kept point. */
  readonly source: Int32Array;
}

interface DrawnSeries {
  readonly name: string;
  readonly colour: string;
  readonly line: string;
  readonly band: string | null;
}

interface Cursor {
  readonly series: number;
  readonly index: number;
}

const MARGIN = { top: 30, right: 16, bottom: 44, left: 64 };
const COLOURS = 6;
const byX = bisector((x: number) => x).left;
let nextClipId = 0;

/**
 * Curves against a linear or log x, with an optional min/max band per curve and vertical markers.
 * Wheel or drag zooms and pans x; y fits what is in view. The cursor reads the nearest point, a click
 * picks it.
 */
@Component({
  selector: 'qb-line-chart',
  imports: [ChartExportMenu, MatButton],
  templateUrl: './line-chart.html',
  styleUrl: './charts.scss',
  encapsulation: ViewEncapsulation.None,
  host: { class: 'qb-chart-host' },
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class LineChart {
  readonly series = input.required<readonly LineSeries[]>();
  readonly xScale = input<AxisScale>('linear');
  readonly yScale = input<AxisScale>('linear');
  readonly xLabel = input('');
  readonly yLabel = input('');
  /** Unit of x and y in the cursor readout (the axes carry theirs in the label). */
  readonly xUnit = input('');
  readonly yUnit = input('');
  readonly markers = input<readonly ChartMarker[]>([]);
  readonly fileName = input('chart');
  readonly chartTitle = input('');
  readonly height = input(320);
  readonly pointPicked = output<PickedPoint>();

  private readonly svgRef = viewChild.required<ElementRef<SVGSVGElement>>('svg');
  private readonly xAxisRef = viewChild.required<ElementRef<SVGGElement>>('xAxis');
  private readonly yAxisRef = viewChild.required<ElementRef<SVGGElement>>('yAxis');
  private readonly xGridRef = viewChild.required<ElementRef<SVGGElement>>('xGrid');
  private readonly yGridRef = viewChild.required<ElementRef<SVGGElement>>('yGrid');
  private readonly overlayRef = viewChild.required<ElementRef<SVGRectElement>>('overlay');

  protected readonly width = observeWidth();
  protected readonly margin = MARGIN;
  protected readonly clipId = `qb-line-chart-clip-${nextClipId++}`;
  protected readonly svgElement = computed(() => this.svgRef().nativeElement);
  protected readonly innerWidth = computed(() => Math.max(40, this.width() - MARGIN.left - MARGIN.right));
  protected readonly innerHeight = computed(() => Math.max(40, this.height() - MARGIN.top - MARGIN.bottom));

  private readonly transform = signal<ZoomTransform>(zoomIdentity);
  protected readonly zoomed = computed(() => this.transform().k !== 1 || this.transform().x !== 0);
  protected readonly cursor = signal<Cursor | null>(null);
  private zoomBehaviour: ZoomBehavior<SVGRectElement, unknown> | null = null;

  protected readonly prepared = computed(() => this.series().map((s) => prepare(s, this.xScale() === 'log', this.yScale() === 'log')));

  private readonly baseX = computed<Scale>(() => {
    const log = this.xScale() === 'log';
    let low = Infinity;
    let high = -Infinity;
    for (const s of this.prepared()) {
      if (s.x.length === 0) continue;
      low = Math.min(low, s.x[0]);
      high = Math.max(high, s.x[s.x.length - 1]);
    }
    const domain = widen(low, high, log);
    return (log ? scaleLog() : scaleLinear()).domain(domain).range([0, this.innerWidth()]);
  });

  protected readonly x = computed<Scale>(() => this.transform().rescaleX(this.baseX()));

  protected readonly y = computed<Scale>(() => {
    const log = this.yScale() === 'log';
    const [from, to] = this.x().domain();
    let low = Infinity;
    let high = -Infinity;
    for (const s of this.prepared()) {
      const [first, last] = visibleRange(s, from, to);
      for (let i = first; i < last; i++) {
        low = Math.min(low, s.low?.[i] ?? s.y[i], s.y[i]);
        high = Math.max(high, s.high?.[i] ?? s.y[i], s.y[i]);
      }
    }
    const scale = (log ? scaleLog() : scaleLinear()).domain(widen(low, high, log)).range([this.innerHeight(), 0]);
    return log ? scale : scale.nice();
  });

  protected readonly drawn = computed<DrawnSeries[]>(() => {
    const x = this.x();
    const y = this.y();
    const columns = this.innerWidth();
    return this.prepared().map((s, index) => {
      const points = decimate(s, x, columns);
      const path = line<number>()
        .digits(1)
        .x((i) => x(points.x[i]))
        .y((i) => y(points.y[i]))(indices(points.x.length));
      const band =
        points.low && points.high
          ? area<number>()
              .digits(1)
              .x((i) => x(points.x[i]))
              .y0((i) => y((points.low as Float64Array)[i]))
              .y1((i) => y((points.high as Float64Array)[i]))(indices(points.x.length))
          : null;
      return { name: s.name, colour: `series-${index % COLOURS}`, line: path ?? '', band };
    });
  });

  protected readonly visibleMarkers = computed(() => {
    const x = this.x();
    const [from, to] = x.domain();
    return this.markers()
      .filter((marker) => marker.x >= Math.min(from, to) && marker.x <= Math.max(from, to))
      .map((marker) => ({ ...marker, position: x(marker.x) }));
  });

  /** Legend entries laid out in a row, and the row's width, for the top right corner. */
  protected readonly legend = computed(() => {
    let offset = 0;
    const entries = this.drawn().map((s) => {
      const entry = { name: s.name, colour: s.colour, offset };
      offset += 30 + s.name.length * 6.5;
      return entry;
    });
    return { entries: entries.length > 1 ? entries : [], width: offset };
  });

  protected readonly cursorMark = computed(() => {
    const cursor = this.cursor();
    if (cursor === null) return null;
    const s = this.prepared()[cursor.series];
    if (s === undefined || cursor.index >= s.x.length) return null;
    const xValue = s.x[cursor.index];
    const yValue = s.y[cursor.index];
    return {
      cx: this.x()(xValue),
      cy: this.y()(yValue),
      colour: `series-${cursor.series % COLOURS}`,
      text: `${s.name}: ${cursorValue(xValue, this.xUnit())}, ${cursorValue(yValue, this.yUnit())}`,
    };
  });

  protected readonly table = computed<ChartTable>(() => {
    const series = this.series();
    const withBand = series.some((s) => s.yLow !== undefined && s.yHigh !== undefined);
    const xName = this.xLabel() || 'x';
    const yName = this.yLabel() || 'y';
    const columns = ['series', xName, yName, ...(withBand ? [`${yName} low`, `${yName} high`] : [])];
    const rows: (string | number | null)[][] = [];
    for (const s of series) {
      for (let i = 0; i < s.x.length; i++) {
        const row: (string | number | null)[] = [s.name, s.x[i], s.y[i]];
        if (withBand) row.push(s.yLow?.[i] ?? null, s.yHigh?.[i] ?? null);
        rows.push(row);
      }
    }
    return { columns, rows };
  });

  constructor() {
    afterRenderEffect(() => {
      const x = this.x();
      const y = this.y();
      const ticksX = Math.max(2, Math.round(this.innerWidth() / 90));
      const ticksY = Math.max(2, Math.round(this.innerHeight() / 50));
      select(this.xAxisRef().nativeElement).call(axisBottom(x).ticks(ticksX).tickFormat(axisTickFormat(x, ticksX)));
      select(this.yAxisRef().nativeElement).call(axisLeft(y).ticks(ticksY).tickFormat(axisTickFormat(y, ticksY)));
      select(this.xGridRef().nativeElement)
        .call(axisBottom(x).ticks(ticksX).tickSize(-this.innerHeight()).tickFormat(() => ''))
        .call((grid) => grid.select('.domain').remove());
      select(this.yGridRef().nativeElement)
        .call(axisLeft(y).ticks(ticksY).tickSize(-this.innerWidth()).tickFormat(() => ''))
        .call((grid) => grid.select('.domain').remove());
    });
    afterRenderEffect(() => {
      const overlay = this.overlayRef().nativeElement;
      const extent: [[number, number], [number, number]] = [
        [0, 0],
        [this.innerWidth(), this.innerHeight()],
      ];
      if (this.zoomBehaviour === null) {
        this.zoomBehaviour = zoom<SVGRectElement, unknown>()
          .scaleExtent([1, 1e6])
          .on('zoom', (event: { transform: ZoomTransform }) => this.transform.set(event.transform));
        select(overlay).call(this.zoomBehaviour);
      }
      this.zoomBehaviour.extent(extent).translateExtent(extent);
    });
  }

  protected resetZoom(): void {
    if (this.zoomBehaviour !== null) select(this.overlayRef().nativeElement).call(this.zoomBehaviour.transform, zoomIdentity);
  }

  protected follow(event: PointerEvent): void {
    this.cursor.set(this.nearest(event));
  }

  protected leave(): void {
    this.cursor.set(null);
  }

  protected pick(event: MouseEvent): void {
    const nearest = this.nearest(event);
    if (nearest === null) return;
    const s = this.prepared()[nearest.series];
    this.pointPicked.emit({ series: s.name, index: s.source[nearest.index], x: s.x[nearest.index], y: s.y[nearest.index] });
  }

  /** The point nearest the pointer on screen, among each series' nearest in x. */
  private nearest(event: MouseEvent): Cursor | null {
    const box = this.overlayRef().nativeElement.getBoundingClientRect();
    const px = event.clientX - box.left;
    const py = event.clientY - box.top;
    const x = this.x();
    const y = this.y();
    const xValue = x.invert(px);
    let best: Cursor | null = null;
    let bestDistance = Infinity;
    this.prepared().forEach((s, series) => {
      if (s.x.length === 0) return;
      const after = Math.min(s.x.length - 1, byX(s.x, xValue));
      const candidates = after > 0 ? [after - 1, after] : [after];
      for (const index of candidates) {
        const distance = Math.hypot(x(s.x[index]) - px, y(s.y[index]) - py);
        if (distance < bestDistance) {
          bestDistance = distance;
          best = { series, index };
        }
      }
    });
    return best;
  }
}

function indices(count: number): number[] {
  return Array.from({ length: count }, (_, i) => i);
}

/** A domain that a scale can draw even for one value or none. */
function widen(low: number, high: number, log: boolean): [number, number] {
  if (!Number.isFinite(low) || !Number.isFinite(high)) return log ? [1, 10] : [0, 1];
  if (low === high) return log ? [low / 2, high * 2] : low === 0 ? [-1, 1] : [low - Math.abs(low) / 2, high + Math.abs(high) / 2];
  return [low, high];
}

/** Keeps the finite points (positive ones on a log axis), ascending in x. */
function prepare(series: LineSeries, logX: boolean, logY: boolean): PreparedSeries {
  const count = Math.min(series.x.length, series.y.length);
  const descending = count > 1 && series.x[0] > series.x[count - 1];
  const keep: number[] = [];
  for (let n = 0; n < count; n++) {
    const i = descending ? count - 1 - n : n;
    const xi = series.x[i];
    const yi = series.y[i];
    if (!Number.isFinite(xi) || !Number.isFinite(yi) || (logX && xi <= 0) || (logY && yi <= 0)) continue;
    keep.push(i);
  }
  const take = (values: ArrayLike<number>, clampLog: boolean) =>
    Float64Array.from(keep, (i) => (clampLog ? Math.max(values[i], Number.MIN_VALUE) : values[i]));
  const band = series.yLow !== undefined && series.yHigh !== undefined;
  return {
    name: series.name,
    x: take(series.x, false),
    y: take(series.y, false),
    low: band ? take(series.yLow as ArrayLike<number>, logY) : null,
    high: band ? take(series.yHigh as ArrayLike<number>, logY) : null,
    source: Int32Array.from(keep),
  };
}

/** Indices [first, last) of the points inside [from, to], with one neighbour each side so lines reach the edge. */
function visibleRange(series: PreparedSeries, from: number, to: number): [number, number] {
  const low = Math.min(from, to);
  const high = Math.max(from, to);
  const first = Math.max(0, byX(series.x, low) - 1);
  const last = Math.min(series.x.length, byX(series.x, high) + 1);
  return [first, last];
}

/**
 * The points to draw: all of them when they fit two to a pixel column, else per column the lowest
 * and the highest (in their order), so that peaks and the band's edges stay visible.
 */
function decimate(series: PreparedSeries, x: Scale, columns: number): { x: Float64Array; y: Float64Array; low: Float64Array | null; high: Float64Array | null } {
  const [from, to] = x.domain();
  const [first, last] = visibleRange(series, from, to);
  const count = last - first;
  if (count <= 2 * columns) {
    return {
      x: series.x.subarray(first, last),
      y: series.y.subarray(first, last),
      low: series.low?.subarray(first, last) ?? null,
      high: series.high?.subarray(first, last) ?? null,
    };
  }
  const keep: number[] = [];
  let column = Math.floor(x(series.x[first]));
  let start = first;
  const flush = (end: number) => {
    let lowest = start;
    let highest = start;
    for (let i = start + 1; i < end; i++) {
      if (series.y[i] < series.y[lowest]) lowest = i;
      if (series.y[i] > series.y[highest]) highest = i;
    }
    keep.push(Math.min(lowest, highest));
    if (lowest !== highest) keep.push(Math.max(lowest, highest));
  };
  for (let i = first + 1; i < last; i++) {
    const c = Math.floor(x(series.x[i]));
    if (c !== column) {
      flush(i);
      start = i;
      column = c;
    }
  }
  flush(last);
  const bandColumn = (values: Float64Array | null, pick: (a: number, b: number) => number) => {
    if (values === null) return null;
    // Each kept point stands for the points up to the next kept one: the band keeps their extreme.
    return Float64Array.from(keep, (i, n) => {
      const end = n + 1 < keep.length ? keep[n + 1] : i + 1;
      let value = values[i];
      for (let j = i + 1; j < end; j++) value = pick(value, values[j]);
      return value;
    });
  };
  return {
    x: Float64Array.from(keep, (i) => series.x[i]),
    y: Float64Array.from(keep, (i) => series.y[i]),
    low: bandColumn(series.low, Math.min),
    high: bandColumn(series.high, Math.max),
  };
}
