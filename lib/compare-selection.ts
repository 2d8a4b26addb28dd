/**
 * Which profiles the compare screen shows and which measurements it takes: pure choices, no calc,
 * so the screen can make them before calc's chunk has loaded (./compare-analysis runs the analysis).
 */
import type { Measurement, MeasurementData, MeasurementKind } from '@/shared/measurements';
import type { Profile } from '@/shared/profile';

/** The newest measurement of each kind from a job's list (as the server's latestMeasurements picks them). */
export function latestMeasured(list: readonly Measurement[]): Partial<MeasurementData> {
  const out: Partial<Record<MeasurementKind, { at: string; data: unknown }>> = {};
  for (const m of list) {
    const seen = out[m.kind];
    if (!seen || m.createdAt > seen.at) out[m.kind] = { at: m.createdAt, data: m.data };
  }
  return Object.fromEntries(Object.entries(out).map(([k, v]) => [k, v.data])) as Partial<MeasurementData>;
}

/** The profiles chosen on a job, in the order picked; with no choice yet, the job's first two. */
export function chosenProfiles(picked: readonly string[] | undefined, profiles: readonly Profile[]): Profile[] {
  const ids = picked ?? profiles.slice(0, 2).map((p) => p.id);
  return ids.map((id) => profiles.find((p) => p.id === id)).filter((p): p is Profile => Boolean(p));
}

/** Adds or removes a profile from the comparison, keeping the three most recently picked. */
export function toggleChoice(current: readonly string[], id: string): string[] {
  return current.includes(id) ? current.filter((x) => x !== id) : [...current, id].slice(-3);
}
