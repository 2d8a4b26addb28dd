import { describe, expect, it } from 'vitest';

import { DEMO_ENGINE, DEMO_TOWING } from '@/calc/demo';

import { analyzeRecords, revisionResults } from '@/shared/analysis';
import { engineSchema } from '@/shared/engine';
import { profileSpecSchema } from '@/shared/profile';
import { diffRevisions } from '@/lib/revision-diff';
import type { Revision } from '@/shared/sheets';

const engine = engineSchema.parse(DEMO_ENGINE);
const spec = profileSpecSchema.parse(DEMO_TOWING);
const revision = (overrides: Partial<Revision>): Revision => ({
  id: 'r',
  sheetId: 's',
  number: 1,
  state: 'draft',
  label: 'Towing',
  spec,
  engine,
  results: revisionResults(analyzeRecords(engine, spec)),
  note: '',
  coreNotes: '',
  createdBy: null,
  createdAt: '2026-01-01T00:00:00.000Z',
  updatedAt: '2026-01-01T00:00:00.000Z',
  issuedAt: null,
  supersededBy: null,
  ...overrides,
});

describe('revision diff', () => {
  it('finds nothing between identical revisions, whatever their number and state', () => {
    expect(diffRevisions(revision({}), revision({ number: 2, state: 'issued', id: 'r2' }))).toEqual([]);
  });

  it('lists each changed value with its label, old and new text', () => {
    const b = revision({
      spec: { ...spec, lsa: 110, intake: { ...spec.intake, duration050: 216 } },
      note: 'More intake',
      engine: { ...engine, chamberCc: 70 },
    });
    expect(diffRevisions(revision({}), b)).toEqual([
      { path: 'note', label: 'Note', from: '', to: 'More intake' },
      { path: 'spec.intake.duration050', label: 'Intake duration at 0.050 in (°)', from: '212', to: '216' },
      { path: 'spec.lsa', label: 'Lobe separation (° cam)', from: '112', to: '110' },
      { path: 'engine.chamberCc', label: 'Engine: chamber (cc)', from: '68', to: '70' },
    ]);
  });

  it('lists changed core notes, which go to the grinder with the revision', () => {
    expect(diffRevisions(revision({}), revision({ coreNotes: 'Grind on the customer core' }))).toEqual([
      { path: 'coreNotes', label: 'Core notes', from: '', to: 'Grind on the customer core' },
    ]);
  });
});
