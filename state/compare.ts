import { atom, useAtom } from 'jotai';
import { useMemo } from 'react';

import { useCalc } from '@/components/ui/lazy-calc';
import type { CompareCore } from '@/lib/compare-analysis';
import { chosenProfiles, toggleChoice } from '@/lib/compare-selection';
import type { PlotMode } from '@/lib/lift-plot-paths';
import type { TryDraft } from '@/lib/try-values';
import type { EngineSpec } from '@/shared/engine';
import type { Profile } from '@/shared/profile';
import { unitConverter, useUnits } from '@/state/units';

/** Profiles chosen for comparison, per job (ids, in the order picked; the first is the baseline). */
export const compareSelectionAtom = atom<Record<string, string[]>>({});

/** Tried but unsaved profile values, per profile id: number drafts, in calc units whatever unit they were typed in. */
export const profileDraftsAtom = atom<Record<string, TryDraft | undefined>>({});

/** What the compare plot shows. */
export const plotModeAtom = atom<PlotMode>('lift');

/**
 * The compare screen's state for one job: the chosen profiles, their typed values and each one's analysis.
 * Suspends until calc's chunk has loaded (see components/ui/lazy-calc.tsx).
 */
export function useCompare(jobId: string, engine: EngineSpec, profiles: readonly Profile[], core?: CompareCore) {
  const { analyzeColumn, summarizeColumns } = useCalc();
  const [selection, setSelection] = useAtom(compareSelectionAtom);
  const [drafts, setDrafts] = useAtom(profileDraftsAtom);
  const [mode, setMode] = useAtom(plotModeAtom);
  // Messages name the unit shown; while mathjs loads they name calc's units (the values are calc units either way).
  const { converter } = useUnits();
  const units = useMemo(() => converter ?? unitConverter(null, 'imperial', 'cc'), [converter]);
  const chosen = useMemo(() => chosenProfiles(selection[jobId], profiles), [selection, jobId, profiles]);
  const columns = useMemo(() => chosen.map((p) => analyzeColumn(engine, p, drafts[p.id], units, core)), [analyzeColumn, engine, chosen, drafts, units, core]);
  const summary = useMemo(() => summarizeColumns(columns), [summarizeColumns, columns]);
  const chosenIds = chosen.map((p) => p.id);
  const toggle = (id: string) => setSelection((s) => ({ ...s, [jobId]: toggleChoice(s[jobId] ?? chosenIds, id) }));
  const setDraft = (profileId: string, draft: TryDraft | undefined) => setDrafts((d) => ({ ...d, [profileId]: draft }));
  return { chosen, chosenIds, columns, ...summary, toggle, drafts, setDraft, mode, setMode };
}
