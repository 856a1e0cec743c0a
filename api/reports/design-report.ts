import PDFDocument from 'pdfkit';
import type { Version } from '@shared/contracts/designs-api';
import type { Budget } from '@shared/contracts/figures';
import type { Review } from '@shared/contracts/reviews-api';
import { formatQuantity, type DimensionName } from '@shared/units';

/** The caution every exported report carries (the product brief's wording, in substance). */
export const REPORT_CAUTION =
  'Designs from this tool may end up in medical devices (infusion, dosing). The figures in this report are engineering ' +
  'estimates to be verified on hardware. A device connected to a patient must meet the applicable standards (for example ' +
  'IEC 60601-1 for electrical safety including patient leakage currents, ISO 14971 for risk management, IEC 62304 for device ' +
  "software) and the manufacturer's quality system. Defer to local regulations and to qualified, licensed practice.";

export interface ReportSpectrum {
  /** Node the spectrum was taken on, and how it was made. */
  node: string;
  description: string;
  frequencies: Float64Array;
  /** Amplitude spectral density [V/rtHz]. */
  asd: Float64Array;
  /** Frequencies to mark (the carrier and its harmonics) [Hz]. */
  markers: number[];
}

export interface ReportInput {
  designName: string;
  version: Version;
  budget: Budget;
  reviews: Review[];
  spectrum: ReportSpectrum | null;
  generatedAt: Date;
  generatedBy: string;
  engineVersion: string;
}

const INK = '#1d2b2c';
const MUTED = '#5b6b6c';
const ACCENT = '#0e5e63';
const ALARM = '#b3261e';
const BAND = '#d5e7e6';
const PAGE_MARGIN = 50;

function q(value: number | null, dimension: DimensionName, significant = 3): string {
  return value === null || !Number.isFinite(value) ? 'n/a' : formatQuantity(value, dimension, { significant });
}

function pct(value: number | null, digits = 1): string {
  return value === null || !Number.isFinite(value) ? 'n/a' : `${(value * 100).toFixed(digits)} %`;
}

function db(value: number | null): string {
  return value === null || !Number.isFinite(value) ? 'n/a' : `${value.toFixed(1)} dB`;
}

type Doc = InstanceType<typeof PDFDocument>;

function ensureRoom(doc: Doc, height: number): void {
  if (doc.y + height > doc.page.height - PAGE_MARGIN - 20) doc.addPage();
}

/** A section heading; `room` keeps it on the page with what follows it (a plot needs more). */
function heading(doc: Doc, text: string, room = 60): void {
  ensureRoom(doc, room);
  doc.moveDown(0.8).font('Helvetica-Bold').fontSize(13).fillColor(ACCENT).text(text, PAGE_MARGIN).moveDown(0.3);
  doc.font('Helvetica').fontSize(9.5).fillColor(INK);
}

/** A simple ruled table; columns are given as width fractions of the text width. */
function table(doc: Doc, header: string[], rows: string[][], widths: number[], align: Array<'left' | 'right'> = []): void {
  const width = doc.page.width - 2 * PAGE_MARGIN;
  const xs = widths.reduce<number[]>((acc, w, i) => [...acc, (acc[i] ?? PAGE_MARGIN) + w * width], [PAGE_MARGIN]);
  const rowHeight = 15;
  const drawRow = (cells: string[], bold: boolean) => {
    ensureRoom(doc, rowHeight + 4);
    const y = doc.y;
    doc.font(bold ? 'Helvetica-Bold' : 'Helvetica').fontSize(8.5).fillColor(INK);
    cells.forEach((cell, i) => {
      doc.text(cell, xs[i]! + 2, y + 3, { width: widths[i]! * width - 4, align: align[i] ?? 'left', lineBreak: false, ellipsis: true });
    });
    doc.moveTo(PAGE_MARGIN, y + rowHeight).lineTo(PAGE_MARGIN + width, y + rowHeight).lineWidth(0.4).strokeColor(bold ? INK : '#c9d2d2').stroke();
    doc.y = y + rowHeight;
  };
  drawRow(header, true);
  for (const row of rows) drawRow(row, false);
  doc.x = PAGE_MARGIN;
  doc.moveDown(0.5);
}

function keyFigures(doc: Doc, budget: Budget): void {
  const flow = budget.mode === 'flow';
  const resolution = budget.resolution;
  const rows: string[][] = [
    ['Sensitivity', `${q(budget.sensitivity.voltsPerFarad, 'voltsPerFarad')}; ${flow ? q(budget.sensitivity.voltsPerCubicMetrePerSecond, 'voltsPerVolumeFlow') : q(budget.sensitivity.voltsPerPascal, 'voltsPerPascal')}`],
    ['Demodulator gain D', `${budget.demodulatorGain.toFixed(4)} (${budget.demodulatorHarmonics} odd harmonics; noise folding summed ${budget.harmonicsSummed})`],
    ['Offset, untrimmed / trimmed', `${q(budget.offset.untrimmedVolts, 'voltage')} / ${q(budget.offset.trimmedVolts, 'voltage')} (ideal trim ${budget.offset.idealTrim?.toFixed(5) ?? 'n/a'}, code ${budget.offset.trimCode ?? 'n/a'})`],
    [
      `Resolution (${q(resolution.bandLow, 'frequency')} to ${q(resolution.bandHigh, 'frequency')})`,
      `${q(resolution.farad, 'capacitance')}; ${q(resolution.pascal, 'pressure')}${flow ? `; ${q(resolution.cubicMetrePerSecond, 'volumeFlow')}` : ''}; ${pct(resolution.fullScaleFraction, 4)} of full scale`,
    ],
    ['Total output noise', `${q(budget.noise.outputRms, 'voltage')} rms over ${q(budget.noise.bandLow, 'frequency')} to ${q(budget.noise.bandHigh, 'frequency')}`],
    ['SNR / dynamic range / ENOB', `${db(budget.snr)} / ${db(budget.dynamicRange)} / ${budget.enob === null ? 'n/a' : `${budget.enob.toFixed(1)} bits`}`],
    ['Carrier ripple at the output', `${q(budget.ripple.outputPeak, 'voltage')} peak at ${q(budget.ripple.frequency, 'frequency')}`],
    [
      'Step response (baseband)',
      `rise ${q(budget.stepResponse.riseTime, 'time')}, overshoot ${pct(budget.stepResponse.overshoot)}, settling 1 % ${q(budget.stepResponse.settlingTime1Percent, 'time')}, 0.1 % ${q(budget.stepResponse.settlingTime01Percent, 'time')}`,
    ],
    ['Closest to clipping', budget.closestToClipping ?? 'no node has a swing'],
  ];
  table(doc, ['Figure', 'Value'], rows, [0.32, 0.68]);
}

function noiseTable(doc: Doc, budget: Budget): void {
  const flow = budget.mode === 'flow';
  const rows = [...budget.noise.contributions]
    .sort((a, b) => b.share - a.share)
    .map((c) => [
      c.source,
      c.stage,
      q(c.outputRms, 'voltage'),
      q(c.inputReferred.farad, 'capacitance'),
      flow ? q(c.inputReferred.cubicMetrePerSecond, 'volumeFlow') : q(c.inputReferred.pascal, 'pressure'),
      pct(c.share),
    ]);
  table(doc, ['Source', 'Stage', 'Output rms', 'Input (C)', flow ? 'Input (flow)' : 'Input (p)', 'Share'], rows, [0.32, 0.1, 0.15, 0.15, 0.16, 0.12], ['left', 'left', 'right', 'right', 'right', 'right']);
}

/** Each node's allowed swing as a band with the signal's centre +/- peak drawn inside it. */
function levelDiagram(doc: Doc, budget: Budget): void {
  const levels = budget.levels.filter((l) => l.swingLow !== null && l.swingHigh !== null);
  const height = 150;
  ensureRoom(doc, height + 40);
  const left = PAGE_MARGIN + 40;
  const width = doc.page.width - 2 * PAGE_MARGIN - 40;
  const top = doc.y + 5;
  const lows = levels.flatMap((l) => [l.swingLow!, l.centre - l.peak]);
  const highs = levels.flatMap((l) => [l.swingHigh!, l.centre + l.peak]);
  const vMin = Math.min(0, ...lows);
  const vMax = Math.max(...highs, vMin + 1e-9);
  const y = (v: number) => top + height - ((v - vMin) / (vMax - vMin)) * height;
  doc.font('Helvetica').fontSize(7).fillColor(MUTED);
  for (let i = 0; i <= 4; i += 1) {
    const v = vMin + ((vMax - vMin) * i) / 4;
    doc.moveTo(left, y(v)).lineTo(left + width, y(v)).lineWidth(0.3).strokeColor('#e1e7e7').stroke();
    doc.text(formatQuantity(v, 'voltage', { significant: 2 }), PAGE_MARGIN - 5, y(v) - 3, { width: 42, align: 'right' });
  }
  const slot = width / Math.max(1, levels.length);
  levels.forEach((level, i) => {
    const x = left + i * slot + slot * 0.2;
    const w = slot * 0.6;
    doc.rect(x, y(level.swingHigh!), w, y(level.swingLow!) - y(level.swingHigh!)).fill(BAND);
    const clipping = (level.usedFraction ?? 0) > 1;
    const colour = clipping ? ALARM : level.node === budget.closestToClipping ? '#8a5a00' : ACCENT;
    const hi = Math.min(level.centre + level.peak, vMax);
    const lo = Math.max(level.centre - level.peak, vMin);
    doc.rect(x + w * 0.3, y(hi), w * 0.4, Math.max(0.8, y(lo) - y(hi))).fill(colour);
    doc.fillColor(INK).fontSize(7.5).text(level.node, x - 10, top + height + 4, { width: w + 20, align: 'center' });
    doc.fillColor(MUTED).fontSize(7).text(pct(level.usedFraction, 0), x - 10, top + height + 14, { width: w + 20, align: 'center' });
  });
  doc.y = top + height + 28;
  doc.x = PAGE_MARGIN;
  doc.font('Helvetica').fontSize(8).fillColor(MUTED).text('Shaded: allowed swing. Bar: signal centre +/- peak over the full scale. Percent: share of the room to the nearer limit.', PAGE_MARGIN);
  doc.fillColor(INK);
}

/** Amplitude spectral density on log-log axes, with the carrier and its harmonics marked. */
function spectrumPlot(doc: Doc, spectrum: ReportSpectrum): void {
  const height = 170;
  ensureRoom(doc, height + 50);
  const left = PAGE_MARGIN + 45;
  const width = doc.page.width - 2 * PAGE_MARGIN - 45;
  const top = doc.y + 5;
  const points: Array<[number, number]> = [];
  for (let i = 1; i < spectrum.frequencies.length; i += 1) {
    const f = spectrum.frequencies[i]!;
    const a = spectrum.asd[i]!;
    if (f > 0 && a > 0 && Number.isFinite(a)) points.push([f, a]);
  }
  if (points.length < 2) {
    doc.text('The simulated spectrum has no points to draw.');
    return;
  }
  const fMin = points[0]![0];
  const fMax = points[points.length - 1]![0];
  const aValues = points.map((p) => p[1]);
  const aMin = Math.max(Math.min(...aValues), Math.max(...aValues) * 1e-7);
  const aMax = Math.max(...aValues);
  const lf0 = Math.log10(fMin);
  const lf1 = Math.log10(fMax);
  const la0 = Math.floor(Math.log10(aMin));
  const la1 = Math.ceil(Math.log10(aMax));
  const x = (f: number) => left + ((Math.log10(f) - lf0) / (lf1 - lf0)) * width;
  const y = (a: number) => top + height - ((Math.log10(Math.max(a, 10 ** la0)) - la0) / (la1 - la0)) * height;
  doc.rect(left, top, width, height).lineWidth(0.5).strokeColor('#c9d2d2').stroke();
  doc.font('Helvetica').fontSize(7).fillColor(MUTED);
  for (let e = la0; e <= la1; e += 1) {
    doc.moveTo(left, y(10 ** e)).lineTo(left + width, y(10 ** e)).lineWidth(0.3).strokeColor('#e1e7e7').stroke();
    doc.text(formatQuantity(10 ** e, 'voltageNoiseDensity', { significant: 1 }), PAGE_MARGIN - 10, y(10 ** e) - 3, { width: 52, align: 'right' });
  }
  for (let e = Math.ceil(lf0); e <= Math.floor(lf1); e += 1) {
    doc.moveTo(x(10 ** e), top).lineTo(x(10 ** e), top + height).lineWidth(0.3).strokeColor('#e1e7e7').stroke();
    doc.text(formatQuantity(10 ** e, 'frequency', { significant: 1 }), x(10 ** e) - 20, top + height + 3, { width: 40, align: 'center' });
  }
  for (const marker of spectrum.markers.filter((m) => m > fMin && m < fMax)) {
    doc.moveTo(x(marker), top).lineTo(x(marker), top + height).dash(2, { space: 2 }).lineWidth(0.5).strokeColor('#8a5a00').stroke().undash();
  }
  doc.moveTo(x(points[0]![0]), y(points[0]![1]));
  for (const [f, a] of points.slice(1)) doc.lineTo(x(f), y(a));
  doc.lineWidth(0.8).strokeColor(ACCENT).stroke();
  doc.y = top + height + 16;
  doc.x = PAGE_MARGIN;
  doc.fontSize(8).fillColor(MUTED).text(`${spectrum.description} Dashed: the carrier and its harmonics.`, PAGE_MARGIN);
  doc.fillColor(INK);
}

function findings(doc: Doc, budget: Budget): void {
  if (budget.findings.length === 0) {
    doc.text('No findings: every check of the engine passed.');
    return;
  }
  for (const finding of budget.findings) {
    ensureRoom(doc, 40);
    doc.font('Helvetica-Bold').fillColor(finding.severity === 'error' ? ALARM : INK).text(`${finding.severity.toUpperCase()}  ${finding.path}`, { continued: false });
    doc.font('Helvetica').fillColor(INK).text(finding.message);
    if (finding.suggestion) doc.fillColor(MUTED).text(`Suggested: ${finding.suggestion}`).fillColor(INK);
    doc.moveDown(0.3);
  }
}

function reviewSection(doc: Doc, reviews: Review[], versionNumber: number): void {
  const own = reviews.filter((r) => r.versionNumber === versionNumber);
  if (own.length === 0) {
    doc.text(`Version ${versionNumber} has not been sent for review.`);
    return;
  }
  for (const review of own) {
    const state = review.state === 'pending' ? 'pending' : review.state === 'approved' ? 'APPROVED' : 'CHANGES REQUESTED';
    doc.font('Helvetica-Bold').text(`${state}: reviewer ${review.reviewer?.displayName ?? review.reviewerEmail}, asked by ${review.requestedBy.displayName} on ${review.createdAt.slice(0, 10)}`);
    doc.font('Helvetica');
    if (review.decidedAt) doc.text(`Decided ${review.decidedAt.slice(0, 16).replace('T', ' ')} UTC${review.decisionNote ? `: ${review.decisionNote}` : ''}`);
    doc.moveDown(0.3);
  }
}

/** The design report of one version as a PDF (A4), for the project file. */
export function renderDesignReport(input: ReportInput): Promise<Buffer> {
  const doc = new PDFDocument({
    size: 'A4',
    margin: PAGE_MARGIN,
    bufferPages: true,
    info: { Title: `${input.designName}, version ${input.version.number}`, Author: input.generatedBy, Subject: 'Quietbridge design report', Creator: 'Quietbridge' },
  });
  const chunks: Buffer[] = [];
  doc.on('data', (chunk: Buffer) => chunks.push(chunk));
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });

  const { version, budget } = input;
  doc.font('Helvetica-Bold').fontSize(18).fillColor(ACCENT).text('Quietbridge design report');
  doc.font('Helvetica-Bold').fontSize(14).fillColor(INK).text(input.designName);
  doc.font('Helvetica').fontSize(9.5).fillColor(MUTED);
  doc.text(`Version ${version.number}: "${version.message}", saved by ${version.author.displayName} on ${version.createdAt.slice(0, 16).replace('T', ' ')} UTC`);
  doc.text(`Mode: ${budget.mode}. Design format ${version.formatVersion}; figures recomputed by engine ${input.engineVersion}. Generated ${input.generatedAt.toISOString().slice(0, 16).replace('T', ' ')} UTC for ${input.generatedBy}.`);
  doc.moveDown(0.6);
  const boxTop = doc.y;
  doc.font('Helvetica-Bold').fontSize(9).fillColor(ALARM).text('Caution', PAGE_MARGIN + 8, boxTop + 6);
  doc.font('Helvetica').fontSize(8.5).fillColor(INK).text(REPORT_CAUTION, PAGE_MARGIN + 8, doc.y + 1, { width: doc.page.width - 2 * PAGE_MARGIN - 16 });
  const boxBottom = doc.y + 6;
  doc.rect(PAGE_MARGIN, boxTop, doc.page.width - 2 * PAGE_MARGIN, boxBottom - boxTop).lineWidth(0.8).strokeColor(ALARM).stroke();
  doc.y = boxBottom;
  doc.x = PAGE_MARGIN;

  heading(doc, 'Key figures');
  keyFigures(doc, budget);
  heading(doc, 'Noise budget');
  noiseTable(doc, budget);
  heading(doc, 'Levels at every node', 230);
  levelDiagram(doc, budget);
  heading(doc, 'Output spectrum', 260);
  if (input.spectrum) spectrumPlot(doc, input.spectrum);
  else doc.text('No spectrum: the time-domain simulation of this version did not run.');
  heading(doc, 'Findings');
  findings(doc, budget);
  heading(doc, 'Review');
  reviewSection(doc, input.reviews, version.number);

  const range = doc.bufferedPageRange();
  for (let i = range.start; i < range.start + range.count; i += 1) {
    doc.switchToPage(i);
    // Writing inside the bottom margin must not start a new page.
    doc.page.margins.bottom = 0;
    const bottom = doc.page.height - PAGE_MARGIN + 15;
    doc.font('Helvetica').fontSize(7.5).fillColor(MUTED);
    doc.text(`${input.designName}, version ${version.number}. Engineering estimates: verify on hardware.`, PAGE_MARGIN, bottom, { lineBreak: false });
    doc.text(`Page ${i + 1} of ${range.count}`, doc.page.width - PAGE_MARGIN - 80, bottom, { width: 80, align: 'right', lineBreak: false });
  }
  doc.end();
  return done;
}
