import { analyzeLiftTable, findWornLobesByKind, lobeKind, tableMaxLifts, type LiftTableAnalysis, type WornLobeRow } from '@/calc/measured';
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
 * A lobe whose table cannot be analysed is still judged on its highest reading.
 */
export function analyzeLobes(data: MeasurementData['lobes'], threshold: number): LobeRow[] {
  const rows: LobeRow[] = data.lobes.map((lobe) => {
    const kind = lobeKind(lobe.id);
    try {
      return { id: lobe.id, kind, analysis: analyzeLiftTable({ points: lobe.points }), problem: null, wear: null };
    } catch (error) {
      const message = isCalcInputError(error) ? error.message.replace(/^[\w.[\]]+:\s*/, '') : 'could not be read';
      return { id: lobe.id, kind, analysis: null, problem: `Lobe ${lobe.id}: ${message}`, wear: null };
    }
  });
  // The same grouping and the same max lifts the fit checks judge (calc's findWornLobesByKind), so both screens agree.
  const wear = findWornLobesByKind({ lobes: tableMaxLifts(data.lobes), threshold });
  for (const row of rows) row.wear = wear.lobes.find((w) => w.id === row.id) ?? null;
  return rows;
}
