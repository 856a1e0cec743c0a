import type { Design } from '@shared/contracts/design';
import { stageFields, stageTitles, type StageKind } from '../workbench/stage-fields';

/** A place a comment can be anchored to: a stage of the chain or a section of the design, and its fields. */
export interface CommentAnchor {
  stage: string;
  label: string;
  fields: readonly { key: string; label: string }[];
}

const sectionLabels: Record<string, string> = { sensor: 'Sensor', excitation: 'Excitation', environment: 'Environment', analysis: 'Analysis' };

/** A camel-case key in words, single letters kept as capitals: "referenceCapacitanceA" -> "Reference capacitance A". */
function words(key: string): string {
  const parts = key.split(/(?=[A-Z])/).map((part) => (part.length === 1 ? part : part.toLowerCase()));
  const text = parts.join(' ');
  return text.charAt(0).toUpperCase() + text.slice(1);
}

/** Leaf keys of a section, nested ones with their parent ("cellA.baseCapacitance"). */
function sectionFields(value: unknown, prefix = ''): { key: string; label: string }[] {
  if (typeof value !== 'object' || value === null || Array.isArray(value)) return [];
  return Object.entries(value).flatMap(([key, item]) => {
    const path = prefix === '' ? key : `${prefix}.${key}`;
    const nested = typeof item === 'object' && item !== null && !Array.isArray(item);
    return nested ? sectionFields(item, path) : [{ key: path, label: path.split('.').map(words).join(' · ') }];
  });
}

/** The stages of the chain, then the sensor and excitation sections, each with the fields a comment can point at. */
export function commentAnchors(design: Design): CommentAnchor[] {
  const chain = design.chain.map((stage) => {
    const kind = stage.kind as StageKind;
    const known = stageFields[kind];
    return {
      stage: stage.id,
      label: `${stage.id} · ${stageTitles[kind] ?? stage.kind}`,
      fields: known ? known.map((field) => ({ key: field.key, label: field.label })) : sectionFields(stage).filter((field) => field.key !== 'id' && field.key !== 'kind'),
    };
  });
  const sections = (['sensor', 'excitation', 'environment', 'analysis'] as const).map((name) => ({
    stage: name,
    label: sectionLabels[name]!,
    fields: sectionFields(design[name]),
  }));
  return [...chain, ...sections];
}

/** How an anchor reads on a comment: "lp · Corner frequency", "Design as a whole". */
export function anchorText(anchors: readonly CommentAnchor[], stage: string | null, field: string | null): string {
  if (stage === null) return 'Design as a whole';
  const anchor = anchors.find((candidate) => candidate.stage === stage);
  const fieldLabel = field === null ? null : (anchor?.fields.find((candidate) => candidate.key === field)?.label ?? field);
  return fieldLabel === null ? stage : `${stage} · ${fieldLabel}`;
}
