/**
 * Paths into a design document, written as the validation messages write them:
 * `excitation.amplitude`, `chain[2].corner`, or by stage id `chain[lp].corner`.
 */
export type PathPart = string | number;

export function parseDesignPath(path: string): PathPart[] | null {
  const parts: PathPart[] = [];
  const pattern = /\.?([A-Za-z_][A-Za-z0-9_]*)|\[(\d+)\]|\[([A-Za-z][A-Za-z0-9_-]*)\]/gy;
  let match: RegExpExecArray | null;
  let end = 0;
  while ((match = pattern.exec(path)) !== null) {
    if (match[1] !== undefined) parts.push(match[1]);
    else if (match[2] !== undefined) parts.push(Number(match[2]));
    else parts.push(`#${match[3]}`);
    end = pattern.lastIndex;
  }
  return end === path.length && parts.length > 0 ? parts : null;
}

/** Resolves `#id` parts (stage ids) to array indices against the document. */
function resolve(document: unknown, parts: readonly PathPart[]): PathPart[] | null {
  const resolved: PathPart[] = [];
  let node: unknown = document;
  for (const part of parts) {
    let key: PathPart = part;
    if (typeof part === 'string' && part.startsWith('#')) {
      if (!Array.isArray(node)) return null;
      const index = node.findIndex((entry) => typeof entry === 'object' && entry !== null && (entry as { id?: unknown }).id === part.slice(1));
      if (index < 0) return null;
      key = index;
    }
    if (typeof node !== 'object' || node === null) return null;
    resolved.push(key);
    node = (node as Record<PathPart, unknown>)[key];
  }
  return resolved;
}

/** The number at `path`, or null when there is none. */
export function numberAt(document: unknown, path: readonly PathPart[]): number | null {
  const parts = resolve(document, path);
  if (parts === null) return null;
  let node: unknown = document;
  for (const part of parts) node = (node as Record<PathPart, unknown>)[part];
  return typeof node === 'number' ? node : null;
}

/** A copy of the document with the number at `path` replaced; only the objects along the path are copied. */
export function withNumberAt<T>(document: T, path: readonly PathPart[], value: number): T | null {
  const parts = resolve(document, path);
  if (parts === null) return null;
  const copy = (node: unknown, depth: number): unknown => {
    if (depth === parts.length) return value;
    const key = parts[depth];
    if (Array.isArray(node)) {
      const next = node.slice();
      next[key as number] = copy(node[key as number], depth + 1);
      return next;
    }
    const record = node as Record<string, unknown>;
    return { ...record, [key]: copy(record[key as string], depth + 1) };
  };
  return copy(document, 0) as T;
}
