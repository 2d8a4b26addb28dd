import { z } from 'zod';

import { draftsFor, resolveDrafts, type NumberDraft, type NumberSpec, type ShownUnits } from '@/lib/number-draft';
import { profileNumberSpecs } from '@/lib/profile-fields';
import { profileSpecSchema, type ProfileSpec } from '@/shared/profile';

/** The profile values the compare screen lets a builder try: the profile form's own specs, so the same units, ranges and messages. */
export const tryValueSpecs: readonly NumberSpec[] = [
  profileNumberSpecs.intake.duration050,
  profileNumberSpecs.exhaust.duration050,
  profileNumberSpecs.intake.advertisedDuration,
  profileNumberSpecs.exhaust.advertisedDuration,
  profileNumberSpecs.intake.lobeLift,
  profileNumberSpecs.exhaust.lobeLift,
  profileNumberSpecs.lsa,
  profileNumberSpecs.icl,
];

type LobeTry = { duration050: NumberDraft; advertisedDuration: NumberDraft; lobeLift: NumberDraft };
/** What the try-values form holds: a number draft per tried field, under `spec` like the profile form. Values are in calc units. */
export type TryDraft = { spec: { intake: LobeTry; exhaust: LobeTry; lsa: NumberDraft; icl: NumberDraft } };

/** The tried record: the saved spec with the tried numbers in place, checked by the profile's schema. */
export const tryValuesSchema = z.object({ spec: profileSpecSchema });

/** The form's starting drafts: the saved values. */
export function tryDraftFrom(spec: ProfileSpec): TryDraft {
  return draftsFor(tryValueSpecs, { spec }) as TryDraft;
}

/** The saved spec as the record the tried numbers are written into (fields not tried keep their saved value). */
export const triedRecord = (spec: ProfileSpec) => ({ spec: structuredClone(spec) });

/**
 * Applies tried values to a saved spec and checks the result with the schema the server uses.
 * The drafts hold calc units (inches) whatever unit they were typed in; `units` only words the messages.
 */
export function applyTryValues(
  spec: ProfileSpec,
  draft: TryDraft,
  units: ShownUnits,
): { ok: true; spec: ProfileSpec } | { ok: false; errors: Partial<Record<string, string>> } {
  const result = resolveDrafts(tryValueSpecs, draft, triedRecord(spec), tryValuesSchema, units);
  return result.errors === null ? { ok: true, spec: result.values.spec } : { ok: false, errors: result.errors };
}

/** True when two specs hold the same numbers (key order does not matter). */
export function sameSpec(a: ProfileSpec, b: ProfileSpec): boolean {
  const same = (x: unknown, y: unknown): boolean => {
    if (x === y) return true;
    if (typeof x !== 'object' || typeof y !== 'object' || x === null || y === null) return false;
    const kx = Object.keys(x);
    return kx.length === Object.keys(y).length && kx.every((k) => same((x as Record<string, unknown>)[k], (y as Record<string, unknown>)[k]));
  };
  return same(a, b);
}
