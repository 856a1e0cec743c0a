import { DESIGN_FORMAT, DESIGN_FORMAT_VERSION, designSchema, validateDesign, type DesignValidation } from './design';

/**
 * Reads a design document of any format version this code knows, upgrading older ones step by step
 * to the current version before validation, so that old exports and stored versions stay usable.
 */
export type DesignLoad = DesignValidation & { upgradedFrom: number | null };

type Upgrade = (document: Record<string, unknown>) => Record<string, unknown>;

/**
 * upgrades[n] turns version n into version n + 1. Version 0 is the draft written before the format
 * carried a name and version: the same fields, without `format`/`version`.
 */
const upgrades: Record<number, Upgrade> = {
  0: (document) => ({ ...document, format: DESIGN_FORMAT, version: 1 }),
};

export function loadDesign(document: unknown, schema = designSchema): DesignLoad {
  if (typeof document !== 'object' || document === null || Array.isArray(document)) {
    return { ok: false, errors: [{ path: '', message: 'A design must be a JSON object' }], upgradedFrom: null };
  }
  let current = document as Record<string, unknown>;
  const stated = current.version;
  const version = stated === undefined && current.format === undefined ? 0 : stated;
  if (typeof version !== 'number' || !Number.isInteger(version) || version < 0) {
    return { ok: false, errors: [{ path: 'version', message: `Version must be a whole number up to ${DESIGN_FORMAT_VERSION}` }], upgradedFrom: null };
  }
  if (version > DESIGN_FORMAT_VERSION) {
    return {
      ok: false,
      errors: [{ path: 'version', message: `This design was written in format version ${version}; this Quietbridge reads versions up to ${DESIGN_FORMAT_VERSION}` }],
      upgradedFrom: null,
    };
  }
  for (let v = version; v < DESIGN_FORMAT_VERSION; v++) current = upgrades[v](current);
  return { ...validateDesign(current, schema), upgradedFrom: version === DESIGN_FORMAT_VERSION ? null : version };
}
