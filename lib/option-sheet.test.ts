import { describe, expect, it } from 'vitest';

import { saveToSheetLabel, sheetOfProfile } from '@/lib/option-sheet';

type Listed = { id: string; profileId: string | null; title: string; current: { number: number; label: string } };

// The job's sheets as the list answers them: latest change first. The towing sheet is the newest, and its current
// revision carries the stock profile's label (the case that once sent stock values into the towing sheet).
const sheets: Listed[] = [
  { id: 'sheet-towing', profileId: 'profile-towing', title: 'Towing', current: { number: 4, label: 'Stock-spec regrind' } },
  { id: 'sheet-stock', profileId: 'profile-stock', title: 'Stock', current: { number: 1, label: 'Stock-spec regrind' } },
  { id: 'sheet-unbound', profileId: null, title: 'Older', current: { number: 2, label: 'Economy' } },
];

describe('the sheet an option saves into', () => {
  it("is the profile's own sheet, by id, whatever the labels and whichever changed last", () => {
    expect(sheetOfProfile(sheets, 'profile-stock')?.id).toBe('sheet-stock');
    expect(sheetOfProfile(sheets, 'profile-towing')?.id).toBe('sheet-towing');
  });

  it('is none for a profile without a sheet: never the newest sheet, never one no profile owns', () => {
    expect(sheetOfProfile(sheets, 'profile-economy')).toBeUndefined();
    expect(sheetOfProfile(undefined, 'profile-stock')).toBeUndefined();
  });

  it('names the profile whose sheet the button writes, and the revision it starts', () => {
    expect(saveToSheetLabel('Towing', sheets[0])).toBe('Save to the “Towing” sheet as revision 5');
    expect(saveToSheetLabel('Economy', undefined)).toBe('Start the “Economy” sheet with these values');
  });
});
