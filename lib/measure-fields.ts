import { z } from 'zod';

import { draftFromValue, getAt, type NumberDraft, type NumberSpec } from '@/lib/number-draft';
import { measurementDataSchemas, type MeasurementKind } from '@/shared/measurements';

/** A number input: a NumberSpec without its path (the form gives it one, per row in a group). */
export type MeasureNumber = Omit<NumberSpec, 'path'> & {
  key: string;
  text?: undefined;
  /** Blank leaves the schema's default in place instead of saving null. */
  blank?: 'default';
};
/** A short text input (e.g. which valve). */
export type MeasureText = { key: string; label: string; hint?: string; text: true };
export type MeasureField = MeasureNumber | MeasureText;

/** A list of readings with the same columns, rows added and removed by the tech. */
export type MeasureGroup = { key: string; title: string; rowName: string; columns: MeasureField[] };

/** A pick between a few values. */
export type MeasureChoice = { key: string; label: string; choices: readonly { value: string; label: string }[] };

export type MeasureConfig = {
  kind: Exclude<MeasurementKind, 'lobes'>;
  choice?: MeasureChoice;
  scalars?: MeasureField[];
  groups?: MeasureGroup[];
  /** What to start from when nothing is recorded yet, as a (partial) record; fields not named start blank. */
  blank: Record<string, unknown>;
};

/** What the form holds: the record's own shape, with a number draft wherever the record has a number. */
export type MeasureDraft = Record<string, unknown>;

export const specOf = (field: MeasureNumber, path: string): NumberSpec => ({ ...field, path });

/** Every field of a record as the form holds it now: scalars, then each row of each group. */
function fieldsOf(config: MeasureConfig, values: MeasureDraft): { path: string; field: MeasureField }[] {
  const fields = (config.scalars ?? []).map((field) => ({ path: field.key, field }));
  for (const g of config.groups ?? []) {
    const rows = getAt(values, g.key);
    const count = Array.isArray(rows) ? rows.length : 0;
    for (let i = 0; i < count; i++) fields.push(...g.columns.map((field) => ({ path: `${g.key}.${i}.${field.key}`, field })));
  }
  return fields;
}

export function numberSpecs(config: MeasureConfig, values: MeasureDraft): NumberSpec[] {
  return fieldsOf(config, values).flatMap(({ path, field }) => (field.text ? [] : [specOf(field, path)]));
}

export function rowDraft(columns: MeasureField[], item: Record<string, unknown>): Record<string, unknown> {
  return Object.fromEntries(
    columns.map((c) => {
      const saved = item[c.key];
      return [c.key, c.text ? String(saved ?? '') : draftFromValue(specOf(c, c.key), typeof saved === 'number' ? saved : null)];
    }),
  );
}

/** A saved record (or the config's blank) as the form's drafts. */
export function measureDraftFrom(config: MeasureConfig, data: unknown): MeasureDraft {
  const record = (typeof data === 'object' && data !== null ? data : config.blank) as Record<string, unknown>;
  const draft: MeasureDraft = {};
  if (config.choice) draft[config.choice.key] = String(record[config.choice.key] ?? '');
  Object.assign(draft, rowDraft(config.scalars ?? [], record));
  for (const g of config.groups ?? []) {
    const list = Array.isArray(record[g.key]) ? (record[g.key] as Record<string, unknown>[]) : [];
    draft[g.key] = list.map((item) => rowDraft(g.columns, item));
  }
  return draft;
}

/** The shared schema for the kind, after blanks that mean "use the default" are left out (never saved as zero or null). */
export function recordSchema(config: MeasureConfig, values: MeasureDraft) {
  const defaults = fieldsOf(config, values).filter(({ field }) => !field.text && field.blank === 'default');
  return z.preprocess((record) => {
    for (const { path } of defaults) {
      const parent = getAt(record, path.split('.').slice(0, -1).join('.')) as Record<string, unknown> | undefined;
      const key = path.split('.').pop()!;
      if (parent && parent[key] === null) delete parent[key];
    }
    return record;
  }, measurementDataSchemas[config.kind]);
}

/** Every path the form shows, for placing the server's field messages. */
export function knownPaths(config: MeasureConfig, values: MeasureDraft): string[] {
  return [...(config.choice ? [config.choice.key] : []), ...(config.groups ?? []).map((g) => g.key), ...fieldsOf(config, values).map((f) => f.path)];
}

/**
 * How a measurement form becomes the record the server takes, for the form's
 * resolver: the numbers it checks follow the rows (a row added or removed
 * changes them), the rest of the record is the form itself, and the schema
 * is the kind's shared one.
 */
export function measureRules(config: MeasureConfig) {
  return {
    specs: (values: MeasureDraft) => numberSpecs(config, values),
    schema: (values: MeasureDraft) => recordSchema(config, values),
    others: (values: MeasureDraft): Record<string, unknown> => values,
  };
}

/** The number a draft holds, or null when it is blank or not a number (for live read-outs). */
export function draftNumber(draft: unknown): number | null {
  const value = (draft as NumberDraft | undefined)?.value;
  return typeof value === 'number' && Number.isFinite(value) ? value : null;
}
