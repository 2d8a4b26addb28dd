import { analyzeLiftTable, findWornLobes, type LiftTableAnalysis, type WornLobeRow } from '@/calc/measured';
import { isCalcInputError } from '@/calc/errors';
import type { MeasurementData } from '@/shared/measurements';

export type LobeRow = {
  id: string;
  kind: 'intake' | 'exhaust';
  analysis: LiftTableAnalysis | null;
  /** Why the lobe could not be read, in words. */
  problem: string | null;
  wear: WornLobeRow | null;
};

/**
 * Max lift, duration at 0.050 in and centreline for every lobe in an uploaded
 * table, and each lobe against the median of its siblings (intakes with
 * intakes, exhausts with exhausts), flagged when short by more than `threshold` inches.
 */
export function analyzeLobes(data: MeasurementData['lobes'], threshold: number): LobeRow[] {
  const rows: LobeRow[] = data.lobes.map((lobe) => {
    const kind = lobe.id.endsWith('I') ? 'intake' : 'exhaust';
    try {
      return { id: lobe.id, kind, analysis: analyzeLiftTable({ points: lobe.points }), problem: null, wear: null };
    } catch (error) {
      const message = isCalcInputError(error) ? error.message.replace(/^[\w.[\]]+:\s*/, '') : 'could not be read';
      return { id: lobe.id, kind, analysis: null, problem: `Lobe ${lobe.id}: ${message}`, wear: null };
    }
  });
  for (const kind of ['intake', 'exhaust'] as const) {
    const siblings = rows.filter((r) => r.kind === kind && r.analysis);
    if (siblings.length < 2) continue;
    const result = findWornLobes({ lobes: siblings.map((r) => ({ id: r.id, maxLift: r.analysis?.maxLift ?? 0 })), threshold });
    result.lobes.forEach((w, i) => {
      const row = siblings[i];
      if (row) row.wear = w;
    });
  }
  return rows;
}
