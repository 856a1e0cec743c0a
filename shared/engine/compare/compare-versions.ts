import type { Budget } from '../../contracts/figures';
import type { Finding } from '../../contracts/findings';
import type { DimensionName } from '../../units/dimensions';
import { formatQuantity } from '../../units/format';
import { analyseDesign } from '../analyse';
import { stageRegistry, type StageRegistry } from '../stages/registry';
import { dimensionOf, fieldUnit } from './field-units';

/** A value as a design document holds it; undefined where the field is absent. */
export type FieldValue = number | string | boolean | null | readonly number[] | undefined;

/** One field whose value differs between the two documents. */
export interface FieldChange {
  /** Path in the newer document (in the older one for a field that is gone), e.g. `chain[4].corner`. */
  path: string;
  /** Stage id for a chain field; the section ("sensor", "excitation", "environment", "analysis") otherwise, or null at the top level. */
  stage: string | null;
  /** The field inside the stage or section, e.g. "corner", "cellA.baseCapacitance". */
  field: string;
  label: string;
  old: FieldValue;
  new: FieldValue;
  /** SI unit of each value (one per element for a list); empty when dimensionless. */
  units: string[];
  /** Dimension of the first unit, for display with engineering prefixes; null when it has none. */
  dimension: DimensionName | null;
  /** The values in display units, e.g. "1 V" and "2 V". */
  oldText: string;
  newText: string;
}

/** A chain stage added, removed or moved, by id. */
export interface StageChange {
  id: string;
  kind: string;
  change: 'added' | 'removed' | 'moved';
  /** Position in the older and newer chain; null where the stage is not there. */
  oldIndex: number | null;
  newIndex: number | null;
}

export type FigureKey = 'sensitivity' | 'resolutionCapacitance' | 'resolutionPressure' | 'resolutionFlow' | 'outputNoise' | 'worstHeadroom' | 'ripple';

/** better / worse by the figure's sense; same within rounding; changed when one side has no value. */
export type FigureDirection = 'better' | 'worse' | 'same' | 'changed';

export interface FigureChange {
  key: FigureKey;
  label: string;
  old: number | null;
  new: number | null;
  oldText: string;
  newText: string;
  direction: FigureDirection;
  /** Which way is better: a higher or a lower value. */
  sense: 'higher' | 'lower';
}

export interface FindingChange {
  change: 'added' | 'gone';
  finding: Finding;
}

export interface VersionComparison {
  fields: FieldChange[];
  stages: StageChange[];
  /** Every key figure of both versions, with the direction of its change; empty when either document does not validate. */
  figures: FigureChange[];
  /** Findings by code and path: in the newer version only (added) or in the older only (gone). */
  findings: FindingChange[];
  /** Whether each document validated; a document that does not is compared field by field as written. */
  oldValid: boolean;
  newValid: boolean;
}

type Document = Record<string, unknown>;

/** Relative change below which two figures count as the same: it would not show in the three digits the figures are read in. */
const SAME_WITHIN = 1e-3;

function isNumberList(value: unknown): value is number[] {
  return Array.isArray(value) && value.every((item) => typeof item === 'number');
}

function sameValue(a: FieldValue, b: FieldValue): boolean {
  if (isNumberList(a) && isNumberList(b)) return a.length === b.length && a.every((item, index) => item === b[index]);
  return a === b;
}

function formatNumber(value: number, unit: string): string {
  const dimension = dimensionOf(unit);
  if (dimension !== null) return formatQuantity(value, dimension);
  const text = String(Number(value.toPrecision(4)));
  return unit === '' ? text : `${text} ${unit}`;
}

/** A document value in display units: "2.2 pF", "[100 mV, 4.9 V]", "butterworth", "(absent)". */
export function formatFieldValue(value: FieldValue, units: readonly string[]): string {
  if (value === undefined) return '(absent)';
  if (value === null) return 'none';
  if (typeof value === 'number') return formatNumber(value, units[0] ?? '');
  if (isNumberList(value)) return `[${value.map((item, index) => formatNumber(item, units[index] ?? units[0] ?? '')).join(', ')}]`;
  return String(value);
}

/** Leaves of a document section, number lists kept whole: key path -> value. */
function leaves(value: unknown, keys: string[], into: Map<string, { keys: string[]; value: FieldValue }>): void {
  if (value === undefined) return;
  if (typeof value === 'object' && value !== null && !Array.isArray(value)) {
    for (const [key, item] of Object.entries(value)) leaves(item, [...keys, key], into);
  } else if (Array.isArray(value) && !isNumberList(value)) {
    value.forEach((item, index) => leaves(item, [...keys, String(index)], into));
  } else {
    into.set(keys.join('.'), { keys, value: value as FieldValue });
  }
}

function modeOf(document: Document): string | undefined {
  const sensor = document['sensor'];
  return typeof sensor === 'object' && sensor !== null ? ((sensor as Document)['mode'] as string | undefined) : undefined;
}

interface Side {
  document: Document;
  mode: string | undefined;
}

function compareLeaves(
  older: unknown,
  newer: unknown,
  describe: (keys: string[], mode: string | undefined) => { label: string; units: string[] },
  place: { stage: string | null; pathOf: (keys: string[], side: 'old' | 'new') => string },
  sides: { old: Side; new: Side },
): FieldChange[] {
  const a = new Map<string, { keys: string[]; value: FieldValue }>();
  const b = new Map<string, { keys: string[]; value: FieldValue }>();
  leaves(older, [], a);
  leaves(newer, [], b);
  const changes: FieldChange[] = [];
  for (const key of new Set([...b.keys(), ...a.keys()])) {
    const before = a.get(key);
    const after = b.get(key);
    if (before !== undefined && after !== undefined && sameValue(before.value, after.value)) continue;
    const keys = (after ?? before)!.keys;
    const oldUnits = describe(keys, sides.old.mode).units;
    const newUnits = describe(keys, sides.new.mode);
    changes.push({
      path: place.pathOf(keys, after === undefined ? 'old' : 'new'),
      stage: place.stage,
      field: keys.join('.'),
      label: newUnits.label,
      old: before?.value,
      new: after?.value,
      units: newUnits.units,
      dimension: dimensionOf(newUnits.units[0] ?? ''),
      oldText: formatFieldValue(before?.value, oldUnits),
      newText: formatFieldValue(after?.value, newUnits.units),
    });
  }
  return changes;
}

function documentPath(prefix: string, keys: readonly string[]): string {
  return keys.reduce((path, key) => (/^\d+$/.test(key) ? `${path}[${key}]` : path === '' ? key : `${path}.${key}`), prefix);
}

interface ChainEntry {
  id: string;
  kind: string;
  index: number;
  stage: Document;
}

function chainOf(document: Document): ChainEntry[] {
  const chain = document['chain'];
  if (!Array.isArray(chain)) return [];
  return chain.flatMap((stage: unknown, index) => {
    if (typeof stage !== 'object' || stage === null) return [];
    const { id, kind } = stage as Document;
    return typeof id === 'string' ? [{ id, kind: String(kind), index, stage: stage as Document }] : [];
  });
}

function compareChains(sides: { old: Side; new: Side }, registry: StageRegistry): { fields: FieldChange[]; stages: StageChange[] } {
  const older = chainOf(sides.old.document);
  const newer = chainOf(sides.new.document);
  const olderById = new Map(older.map((entry) => [entry.id, entry]));
  const newerById = new Map(newer.map((entry) => [entry.id, entry]));
  const stages: StageChange[] = [];
  const fields: FieldChange[] = [];
  for (const entry of older) {
    if (!newerById.has(entry.id)) stages.push({ id: entry.id, kind: entry.kind, change: 'removed', oldIndex: entry.index, newIndex: null });
  }
  // A stage has moved when its place among the stages both chains hold is not the same.
  const keptOlder = older.filter((entry) => newerById.has(entry.id)).map((entry) => entry.id);
  const keptNewer = newer.filter((entry) => olderById.has(entry.id)).map((entry) => entry.id);
  for (const entry of newer) {
    const before = olderById.get(entry.id);
    if (before === undefined) {
      stages.push({ id: entry.id, kind: entry.kind, change: 'added', oldIndex: null, newIndex: entry.index });
      continue;
    }
    if (keptOlder.indexOf(entry.id) !== keptNewer.indexOf(entry.id)) {
      stages.push({ id: entry.id, kind: entry.kind, change: 'moved', oldIndex: before.index, newIndex: entry.index });
    }
    const { id: _oldId, ...oldFields } = before.stage;
    const { id: _newId, ...newFields } = entry.stage;
    fields.push(
      ...compareLeaves(oldFields, newFields, (keys, mode) => fieldUnit(registry, { stageKind: entry.kind }, keys, mode), {
        stage: entry.id,
        pathOf: (keys, side) => documentPath(`chain[${side === 'new' ? entry.index : before.index}]`, keys),
      }, sides),
    );
  }
  return { fields, stages };
}

function worstHeadroom(budget: Budget): number | null {
  const fractions = budget.levels.map((level) => level.usedFraction).filter((fraction): fraction is number => fraction !== null);
  return fractions.length === 0 ? null : Math.max(...fractions);
}

function percent(fraction: number): string {
  return `${Number((fraction * 100).toPrecision(3))} %`;
}

interface FigureDefinition {
  key: FigureKey;
  label: string;
  sense: 'higher' | 'lower';
  value: (budget: Budget) => number | null;
  format: (value: number, budget: Budget) => string;
}

const figureDefinitions: readonly FigureDefinition[] = [
  { key: 'sensitivity', label: 'Sensitivity', sense: 'higher', value: (b) => b.sensitivity.voltsPerFarad, format: (v) => formatQuantity(v, 'voltsPerFarad') },
  { key: 'resolutionCapacitance', label: 'Resolution in capacitance', sense: 'lower', value: (b) => b.resolution.farad, format: (v) => formatQuantity(v, 'capacitance') },
  { key: 'resolutionPressure', label: 'Resolution in pressure', sense: 'lower', value: (b) => b.resolution.pascal, format: (v) => formatQuantity(v, 'pressure') },
  { key: 'resolutionFlow', label: 'Resolution in flow', sense: 'lower', value: (b) => b.resolution.cubicMetrePerSecond, format: (v) => formatQuantity(v, 'volumeFlow') },
  { key: 'outputNoise', label: 'Total output noise', sense: 'lower', value: (b) => b.noise.outputRms, format: (v) => `${formatQuantity(v, 'voltage')} rms` },
  {
    key: 'worstHeadroom',
    label: 'Worst headroom used',
    sense: 'lower',
    value: worstHeadroom,
    format: (v, b) => (b.closestToClipping === null ? percent(v) : `${percent(v)} at ${b.closestToClipping}`),
  },
  { key: 'ripple', label: 'Carrier ripple at the output', sense: 'lower', value: (b) => b.ripple.outputPeak, format: (v) => `${formatQuantity(v, 'voltage')} peak` },
];

function direction(older: number | null, newer: number | null, sense: 'higher' | 'lower'): FigureDirection {
  if (older === null || newer === null) return 'changed';
  const scale = Math.max(Math.abs(older), Math.abs(newer));
  if (scale === 0 || Math.abs(newer - older) <= SAME_WITHIN * scale) return 'same';
  return (newer > older) === (sense === 'higher') ? 'better' : 'worse';
}

/** The key figures of both budgets; a figure neither version has (flow resolution in pressure mode) is left out. */
export function compareFigures(older: Budget, newer: Budget): FigureChange[] {
  return figureDefinitions.flatMap((definition) => {
    const a = definition.value(older);
    const b = definition.value(newer);
    if (a === null && b === null) return [];
    return [
      {
        key: definition.key,
        label: definition.label,
        old: a,
        new: b,
        oldText: a === null ? 'undefined' : definition.format(a, older),
        newText: b === null ? 'undefined' : definition.format(b, newer),
        direction: direction(a, b, definition.sense),
        sense: definition.sense,
      },
    ];
  });
}

/** Findings keyed by code and path: the ones only the newer budget has, then the ones only the older had. */
export function compareFindings(older: readonly Finding[], newer: readonly Finding[]): FindingChange[] {
  const key = (finding: Finding) => `${finding.code}\u0000${finding.path}`;
  const olderKeys = new Set(older.map(key));
  const newerKeys = new Set(newer.map(key));
  return [
    ...newer.filter((finding) => !olderKeys.has(key(finding))).map((finding) => ({ change: 'added' as const, finding })),
    ...older.filter((finding) => !newerKeys.has(key(finding))).map((finding) => ({ change: 'gone' as const, finding })),
  ];
}

/**
 * What changed from one design document to another: the fields (stages matched by id, so a moved
 * stage does not show as every field changed), the stages added, removed or moved, the key figures
 * with the direction of each change, and the findings added or gone. Documents are compared after
 * loading, so an older format and left-out defaults do not show as changes.
 */
export function compareVersions(oldDocument: unknown, newDocument: unknown, registry: StageRegistry = stageRegistry): VersionComparison {
  const oldAnalysis = analyseDesign(oldDocument, registry);
  const newAnalysis = analyseDesign(newDocument, registry);
  const asDocument = (value: unknown): Document => (typeof value === 'object' && value !== null && !Array.isArray(value) ? (value as Document) : {});
  const oldLoaded = oldAnalysis.ok ? (oldAnalysis.design as unknown as Document) : asDocument(oldDocument);
  const newLoaded = newAnalysis.ok ? (newAnalysis.design as unknown as Document) : asDocument(newDocument);
  const sides = { old: { document: oldLoaded, mode: modeOf(oldLoaded) }, new: { document: newLoaded, mode: modeOf(newLoaded) } };

  const fields: FieldChange[] = [];
  const { chain: _oldChain, ...oldRest } = oldLoaded;
  const { chain: _newChain, ...newRest } = newLoaded;
  const sectionNames = new Set([...Object.keys(newRest), ...Object.keys(oldRest)]);
  for (const name of sectionNames) {
    const isSection = typeof (newRest[name] ?? oldRest[name]) === 'object' && (newRest[name] ?? oldRest[name]) !== null;
    if (isSection) {
      fields.push(
        ...compareLeaves(oldRest[name], newRest[name], (keys, mode) => fieldUnit(registry, { section: name }, keys, mode), { stage: name, pathOf: (keys) => documentPath(name, keys) }, sides),
      );
    } else {
      fields.push(...compareLeaves({ [name]: oldRest[name] }, { [name]: newRest[name] }, (keys) => ({ label: keys[0]!.charAt(0).toUpperCase() + keys[0]!.slice(1), units: [] }), { stage: null, pathOf: (keys) => documentPath('', keys) }, sides));
    }
  }
  const chain = compareChains(sides, registry);
  fields.push(...chain.fields);

  const bothValid = oldAnalysis.ok && newAnalysis.ok;
  return {
    fields,
    stages: chain.stages,
    figures: bothValid ? compareFigures(oldAnalysis.budget, newAnalysis.budget) : [],
    findings: bothValid ? compareFindings(oldAnalysis.budget.findings, newAnalysis.budget.findings) : [],
    oldValid: oldAnalysis.ok,
    newValid: newAnalysis.ok,
  };
}
