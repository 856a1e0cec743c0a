/**
 * Export of a chart: the drawing as a stand-alone SVG (computed styles written inline, so it keeps
 * the theme's look outside the app), the same drawing as a PNG, and the chart's data as CSV.
 */

/** The data behind a chart, one row per mark, as a designer would want it in a spreadsheet. */
export interface ChartTable {
  readonly columns: readonly string[];
  readonly rows: readonly (readonly (string | number | null)[])[];
}

/** Style properties a chart sets through its stylesheet; written inline on export. */
const INLINE_PROPERTIES = [
  'fill',
  'fill-opacity',
  'stroke',
  'stroke-width',
  'stroke-opacity',
  'stroke-dasharray',
  'stroke-linecap',
  'stroke-linejoin',
  'opacity',
  'font-family',
  'font-size',
  'font-weight',
  'text-anchor',
  'dominant-baseline',
  'visibility',
  'display',
  'shape-rendering',
] as const;

const SVG_NAMESPACE = 'http://www.w3.org/2000/svg';

/** Text a spreadsheet would run as a formula starts with one of these. */
const FORMULA_START = /^[=+\-@\t\r]/;

/** One CSV cell: text that could start a formula gets a leading quote; quotes, separators and line breaks are quoted. */
export function csvCell(value: string | number | null): string {
  if (value === null) return '';
  if (typeof value === 'number') return Number.isFinite(value) ? String(value) : '';
  const text = FORMULA_START.test(value) ? `'${value}` : value;
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

/** The table as CSV text (RFC 4180 line ends), header first. */
export function tableToCsv(table: ChartTable): string {
  const lines = [table.columns, ...table.rows].map((row) => row.map(csvCell).join(','));
  return lines.join('\r\n') + '\r\n';
}

/**
 * A copy of the drawing that stands alone: namespaced, sized, every element's computed style
 * inline, and a background in the theme's surface colour.
 */
export function standaloneSvg(svg: SVGSVGElement): string {
  const copy = svg.cloneNode(true) as SVGSVGElement;
  const originals = [svg, ...Array.from(svg.querySelectorAll('*'))];
  const copies = [copy, ...Array.from(copy.querySelectorAll('*'))];
  originals.forEach((original, index) => {
    const style = getComputedStyle(original);
    const declarations = INLINE_PROPERTIES.map((property) => `${property}:${style.getPropertyValue(property)}`).join(';');
    copies[index].setAttribute('style', declarations);
  });
  copy.querySelectorAll('[data-export="skip"]').forEach((element) => element.remove());
  const { width, height } = drawingSize(svg);
  copy.setAttribute('xmlns', SVG_NAMESPACE);
  copy.setAttribute('width', String(width));
  copy.setAttribute('height', String(height));
  copy.setAttribute('viewBox', `0 0 ${width} ${height}`);
  const background = document.createElementNS(SVG_NAMESPACE, 'rect');
  background.setAttribute('width', '100%');
  background.setAttribute('height', '100%');
  background.setAttribute('style', `fill:${getComputedStyle(svg).getPropertyValue('--qb-chart-background') || 'white'}`);
  copy.insertBefore(background, copy.firstChild);
  return new XMLSerializer().serializeToString(copy);
}

function drawingSize(svg: SVGSVGElement): { width: number; height: number } {
  const box = svg.getBoundingClientRect();
  const width = Math.round(box.width) || Number(svg.getAttribute('width')) || 640;
  const height = Math.round(box.height) || Number(svg.getAttribute('height')) || 320;
  return { width, height };
}

/** The drawing rendered on a canvas at the given pixel ratio, as a PNG. */
export function svgToPng(svg: SVGSVGElement, pixelRatio = 2): Promise<Blob> {
  const { width, height } = drawingSize(svg);
  const image = new Image();
  image.width = width;
  image.height = height;
  const loaded = new Promise<void>((resolve, reject) => {
    image.onload = () => resolve();
    image.onerror = () => reject(new Error('The chart could not be drawn as an image'));
  });
  image.src = `data:image/svg+xml;charset=utf-8,${encodeURIComponent(standaloneSvg(svg))}`;
  return loaded.then(
    () =>
      new Promise<Blob>((resolve, reject) => {
        const canvas = document.createElement('canvas');
        canvas.width = Math.round(width * pixelRatio);
        canvas.height = Math.round(height * pixelRatio);
        const context = canvas.getContext('2d');
        if (context === null) {
          reject(new Error('This browser cannot draw on a canvas'));
          return;
        }
        context.scale(pixelRatio, pixelRatio);
        context.drawImage(image, 0, 0, width, height);
        canvas.toBlob((blob) => (blob === null ? reject(new Error('The chart could not be encoded as PNG')) : resolve(blob)), 'image/png');
      }),
  );
}

/** Offers a file to the user through a temporary link. */
export function saveFile(blob: Blob, fileName: string): void {
  const url = URL.createObjectURL(blob);
  const link = document.createElement('a');
  link.href = url;
  link.download = fileName;
  link.rel = 'noopener';
  document.body.appendChild(link);
  link.click();
  link.remove();
  setTimeout(() => URL.revokeObjectURL(url), 0);
}

/** A file name without characters file systems refuse. */
export function safeFileName(name: string): string {
  const cleaned = name.trim().replace(/[\\/:*?"<>|\s\u0000-\u001f]+/g, '-');
  return cleaned === '' ? 'chart' : cleaned;
}

export function exportSvg(svg: SVGSVGElement, fileName: string): void {
  saveFile(new Blob([standaloneSvg(svg)], { type: 'image/svg+xml' }), `${safeFileName(fileName)}.svg`);
}

export async function exportPng(svg: SVGSVGElement, fileName: string): Promise<void> {
  saveFile(await svgToPng(svg), `${safeFileName(fileName)}.png`);
}

export function exportCsv(table: ChartTable, fileName: string): void {
  // A byte-order mark so that spreadsheets read the SI prefixes (µ) as UTF-8.
  saveFile(new Blob(['\ufeff', tableToCsv(table)], { type: 'text/csv;charset=utf-8' }), `${safeFileName(fileName)}.csv`);
}
