import { atom, useAtom } from 'jotai';

/** The spec sheet the tech checks against, per job (UI state shared by the measurement and fit-check screens). */
export const checkedSheetAtom = atom<Record<string, string>>({});

/** The chosen sheet for a job, falling back to the first of `sheetIds`; and a setter. */
export function useCheckedSheet(jobId: string, sheetIds: readonly string[]): [string | null, (id: string) => void] {
  const [chosen, setChosen] = useAtom(checkedSheetAtom);
  const picked = chosen[jobId];
  const current = picked && sheetIds.includes(picked) ? picked : (sheetIds[0] ?? null);
  return [current, (id: string) => setChosen((all) => ({ ...all, [jobId]: id }))];
}
