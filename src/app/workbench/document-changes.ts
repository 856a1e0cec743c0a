/** One field that differs between two design documents. */
export interface DocumentChange {
  /** Document path, e.g. `chain[4].corner`. */
  path: string;
  /** The stage id in front of the path when the field belongs to a stage, e.g. "lp · corner". */
  label: string;
  before: string;
  after: string;
}

type Leaf = string | number | boolean | null;

function flatten(value: unknown, path: string, into: Map<string, Leaf>): void {
  if (Array.isArray(value) && value.every((item) => typeof item === 'number')) {
    into.set(path, `[${value.join(', ')}]`);
  } else if (Array.isArray(value)) {
    value.forEach((item, index) => flatten(item, `${path}[${index}]`, into));
    if (value.length === 0) into.set(path, '[]');
  } else if (typeof value === 'object' && value !== null) {
    for (const [key, item] of Object.entries(value)) flatten(item, path === '' ? key : `${path}.${key}`, into);
  } else {
    into.set(path, value as Leaf);
  }
}

function show(value: Leaf | undefined): string {
  if (value === undefined) return '(absent)';
  if (typeof value === 'number') return String(Number(value.toPrecision(6)));
  if (typeof value === 'string') return value.length > 60 ? `${value.slice(0, 57)}…` : value;
  return String(value);
}

function labelOf(path: string, chain: unknown): string {
  const match = /^chain\[(\d+)\]\.?(.*)$/.exec(path);
  if (!match || !Array.isArray(chain)) return path;
  const id = (chain[Number(match[1])] as { id?: unknown } | undefined)?.id;
  return typeof id === 'string' ? `${id} · ${match[2] || 'stage'}` : path;
}

/** The fields whose values differ between `before` and `after`, in document order. */
export function documentChanges(before: Record<string, unknown>, after: Record<string, unknown>): DocumentChange[] {
  const a = new Map<string, Leaf>();
  const b = new Map<string, Leaf>();
  flatten(before, '', a);
  flatten(after, '', b);
  const paths = [...new Set([...a.keys(), ...b.keys()])];
  return paths
    .filter((path) => a.get(path) !== b.get(path))
    .map((path) => ({ path, label: labelOf(path, after['chain'] ?? before['chain']), before: show(a.get(path)), after: show(b.get(path)) }));
}
