import type { Finding, FindingNumber, FindingSeverity } from '../contracts/findings';

/** Where a finding points: the stage id, its document path prefix and the field. */
export interface FindingTarget {
  stage: string;
  path: string;
}

export function finding(
  severity: FindingSeverity,
  code: string,
  target: FindingTarget,
  field: string,
  message: string,
  numbers: FindingNumber[],
  suggestion: string | null = null,
): Finding {
  const path = target.path === '' ? field : `${target.path}.${field}`;
  return { severity, code, stage: target.stage, field, path, message, numbers, suggestion };
}

export function number(name: string, value: number, unit: string): FindingNumber {
  return { name, value: Number.isFinite(value) ? value : 0, unit };
}

/** Engineering text of a number for messages: 3 significant digits. */
export function digits(value: number): string {
  return String(Number(value.toPrecision(3)));
}
