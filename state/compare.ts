import { atom } from 'jotai';

import type { PlotMode } from '@/lib/lift-plot-paths';
import type { ProfileDraft } from '@/lib/profile-draft';

/** Profiles chosen for comparison, per job (ids, in the order picked; the first is the baseline). */
export const compareSelectionAtom = atom<Record<string, string[]>>({});

/** Typed but unsaved profile values, per profile id. */
export const profileDraftsAtom = atom<Record<string, ProfileDraft>>({});

/** What the compare plot shows. */
export const plotModeAtom = atom<PlotMode>('lift');
