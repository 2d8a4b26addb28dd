import type { Sheet } from '@/shared/sheets';

/**
 * The spec sheet that grinds this job profile (each option has its own), matched by the profile's id: never by
 * label, never "the newest". Undefined when the profile has no sheet yet.
 */
export function sheetOfProfile<S extends Pick<Sheet, 'profileId'>>(sheets: readonly S[] | undefined, profileId: string): S | undefined {
  return sheets?.find((s) => s.profileId === profileId);
}

/** What the compare screen's save button says: whose sheet it writes, and as which revision. */
export function saveToSheetLabel(profileLabel: string, sheet: { current: { number: number } } | undefined): string {
  return sheet ? `Save to the “${profileLabel}” sheet as revision ${sheet.current.number + 1}` : `Start the “${profileLabel}” sheet with these values`;
}
