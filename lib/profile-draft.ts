import { profileSpecSchema, type ProfileSpec } from '@/shared/profile';

/** The profile values the compare screen lets a builder try, as dotted paths into ProfileSpec. */
export const draftFields = [
  { path: 'intake.duration050', label: 'Intake duration at 0.050 in', unit: '°' },
  { path: 'exhaust.duration050', label: 'Exhaust duration at 0.050 in', unit: '°' },
  { path: 'intake.advertisedDuration', label: 'Intake advertised duration', unit: '°' },
  { path: 'exhaust.advertisedDuration', label: 'Exhaust advertised duration', unit: '°' },
  { path: 'intake.lobeLift', label: 'Intake lobe lift', unit: 'in' },
  { path: 'exhaust.lobeLift', label: 'Exhaust lobe lift', unit: 'in' },
  { path: 'lsa', label: 'Lobe separation', unit: '° cam' },
  { path: 'icl', label: 'Intake centreline', unit: '° ATDC' },
] as const;

export type DraftPath = (typeof draftFields)[number]['path'];
/** Typed text for some of the fields; absent fields keep the saved value. */
export type ProfileDraft = Partial<Record<DraftPath, string>>;

function read(spec: ProfileSpec, path: DraftPath): number {
  const [a, b] = path.split('.') as [string, string | undefined];
  const top = (spec as unknown as Record<string, unknown>)[a];
  return (b ? (top as Record<string, number>)[b] : top) as number;
}

/** The text a field shows: the draft if typed, else the saved value. */
export function draftText(spec: ProfileSpec, draft: ProfileDraft, path: DraftPath): string {
  return draft[path] ?? String(read(spec, path));
}

/**
 * Applies typed text to a saved spec and validates the result with the same schema the server uses.
 * Returns the new spec, or the message for each field that is wrong.
 */
export function applyDraft(
  spec: ProfileSpec,
  draft: ProfileDraft,
): { ok: true; spec: ProfileSpec } | { ok: false; errors: Partial<Record<string, string>> } {
  const next = structuredClone(spec) as unknown as Record<string, Record<string, unknown> | unknown>;
  const errors: Partial<Record<string, string>> = {};
  for (const [path, text] of Object.entries(draft) as [DraftPath, string][]) {
    const value = text.trim() === '' ? Number.NaN : Number(text.replace(',', '.'));
    if (!Number.isFinite(value)) errors[path] = 'Enter a number';
    const [a, b] = path.split('.') as [string, string | undefined];
    if (b) (next[a] as Record<string, unknown>)[b] = value;
    else next[a] = value;
  }
  const parsed = profileSpecSchema.safeParse(next);
  if (parsed.success && Object.keys(errors).length === 0) return { ok: true, spec: parsed.data };
  if (parsed.success) return { ok: false, errors };
  for (const issue of parsed.error.issues) errors[issue.path.join('.')] ??= issue.message;
  return { ok: false, errors };
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
