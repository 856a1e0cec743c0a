import { DESIGN_FORMAT_VERSION } from '@shared/contracts/design';
import { loadDesign } from '@shared/contracts/design-loader';
import type { FieldError } from '@shared/contracts/problem';
import type { NewVersion } from './design.repository';
import { computeKeyFigures } from './key-figures';

/**
 * A version ready to store: the document validated (older formats upgraded) and its key figures
 * computed by the shared engine; or the validation errors, with paths like `chain[2].corner`.
 */
export function newVersion(
  document: unknown,
  message: string,
  authorId: string,
  engineVersion: string,
): { ok: true; version: NewVersion } | { ok: false; errors: FieldError[] } {
  const loaded = loadDesign(document);
  if (!loaded.ok) return { ok: false, errors: loaded.errors };
  return {
    ok: true,
    version: {
      document: loaded.design as unknown as Record<string, unknown>,
      message,
      authorId,
      formatVersion: DESIGN_FORMAT_VERSION,
      engineVersion,
      figures: computeKeyFigures(loaded.design),
    },
  };
}
