import fs from 'node:fs';

import { and, count, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { schema } from '@/db';
import { demoLobesFile } from '@/db/demo-lobes';
import { createTestApp, formWith, makeJobBody, makeShop, memberWithRole, type TestApp } from '@/tests/fixtures';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

async function shopWithJob(name = 'Measuring shop') {
  const shop = await makeShop(t, 'repair', name);
  const job = await shop.founder.post('/api/jobs', makeJobBody());
  return { ...shop, jobId: job.body.job.id as string };
}

const springs = {
  kind: 'springs',
  note: 'Left head',
  data: { springs: [{ where: 'left head', installedHeight: 1.8, seatLoad: 115, rate: 320, coilBindHeight: 1.15, retainerToSeal: 0.64 }] },
};
const pushrod = {
  kind: 'pushrod',
  data: { checkingLength: 7.35, plungerTravel: 0.12, targetPreload: 0.045, stockBaseCircle: 1.25 },
};

function lobeRows(n: number, columns = ['1I', '1E']) {
  const rows = [`angle,${columns.join(',')}`];
  for (let i = 0; i < n; i++) rows.push([String(-20 + 10 * i), ...columns.map((_, j) => (0.01 * (i + j)).toFixed(3))].join(','));
  return rows;
}
const csv = (rows: string[]) => formWith([['file', 'lobes.csv', `${rows.join('\n')}\n`, 'text/csv']]);

function measurementCount(jobId: string) {
  return t.db.select({ n: count() }).from(schema.measurements).where(eq(schema.measurements.jobId, jobId)).get()?.n ?? 0;
}

describe('measurements on a job', () => {
  it('creates, lists, reads, edits and deletes, with an audit row for each write', async () => {
    const { shopId, jobId } = await shopWithJob();
    const tech = await memberWithRole(t, shopId, 'tech');
    expect((await tech.get(`/api/jobs/${jobId}/measurements`)).body).toEqual({ measurements: [] });

    const created = await tech.post(`/api/jobs/${jobId}/measurements`, springs);
    expect(created.status).toBe(201);
    const m = created.body.measurement;
    expect(m).toMatchObject({ jobId, kind: 'springs', note: 'Left head', version: 1, createdBy: tech.userId, data: springs.data });
    const second = await tech.post(`/api/jobs/${jobId}/measurements`, pushrod);
    expect(second.status).toBe(201);
    // Defaults from the contract are filled in.
    expect(second.body.measurement.data).toMatchObject({ currentLength: null, originalPreload: null });

    const list = await tech.get(`/api/jobs/${jobId}/measurements`);
    expect(list.body.measurements.map((x: { kind: string }) => x.kind)).toEqual(['pushrod', 'springs']);
    expect((await tech.get(`/api/jobs/${jobId}/measurements?kind=springs`)).body.measurements).toHaveLength(1);
    expect((await tech.get(`/api/jobs/${jobId}/measurements?kind=clay`)).status).toBe(400);
    expect((await tech.get(`/api/measurements/${m.id}`)).body.measurement).toEqual(m);

    const changed = { springs: [{ ...springs.data.springs[0], installedHeight: 1.78 }] };
    const edited = await tech.patch(`/api/measurements/${m.id}`, { version: 1, data: changed, note: 'Re-measured' });
    expect(edited.status).toBe(200);
    expect(edited.body.measurement).toMatchObject({ version: 2, note: 'Re-measured', data: changed });
    const noteOnly = await tech.patch(`/api/measurements/${m.id}`, { version: 2, note: 'Left head, re-measured' });
    expect(noteOnly.body.measurement).toMatchObject({ version: 3, data: changed });

    expect((await tech.delete(`/api/measurements/${m.id}`)).status).toBe(204);
    expect((await tech.get(`/api/measurements/${m.id}`)).status).toBe(404);
    const log = t.db
      .select({ action: schema.auditLog.action })
      .from(schema.auditLog)
      .where(and(eq(schema.auditLog.entity, 'measurement'), eq(schema.auditLog.entityId, m.id)))
      .all();
    expect(log.map((r) => r.action)).toEqual(['create', 'update', 'update', 'delete']);
  });

  it('answers a bad measurement with a 400 naming each field, and a PATCH is checked against the stored kind', async () => {
    const { founder, jobId } = await shopWithJob();
    const bad = await founder.post(`/api/jobs/${jobId}/measurements`, {
      kind: 'springs',
      data: { springs: [{ where: '', installedHeight: 1.1, seatLoad: 'lots', rate: 320, coilBindHeight: 1.2, retainerToSeal: 0.64 }] },
    });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toEqual({
      'data.springs.0.where': expect.stringMatching(/which valve/),
      'data.springs.0.seatLoad': 'Seat load must be a number (lbf)',
    });
    const bound = await founder.post(`/api/jobs/${jobId}/measurements`, {
      kind: 'springs',
      data: { springs: [{ where: '3E', installedHeight: 1.1, seatLoad: 110, rate: 320, coilBindHeight: 1.2, retainerToSeal: 0.64 }] },
    });
    expect(bound.status).toBe(400);
    expect(bound.body.error.fields).toEqual({ 'data.springs.0.coilBindHeight': 'Coil-bind height must be below the installed height' });
    const unknownKind = await founder.post(`/api/jobs/${jobId}/measurements`, { kind: 'lobes', data: {} });
    expect(unknownKind.status).toBe(400);
    expect(measurementCount(jobId)).toBe(0);

    const m = (await founder.post(`/api/jobs/${jobId}/measurements`, pushrod)).body.measurement;
    // Springs data sent to a pushrod measurement is checked as pushrod data.
    const wrongKind = await founder.patch(`/api/measurements/${m.id}`, { version: 1, data: springs.data });
    expect(wrongKind.status).toBe(400);
    expect(wrongKind.body.error.fields).toMatchObject({ 'data.springs': 'Unknown field', 'data.checkingLength': expect.any(String) });
    expect((await founder.get(`/api/measurements/${m.id}`)).body.measurement.version).toBe(1);
  });

  it('answers 409 to a stale version and keeps the first edit', async () => {
    const { founder, jobId } = await shopWithJob();
    const m = (await founder.post(`/api/jobs/${jobId}/measurements`, pushrod)).body.measurement;
    const first = await founder.patch(`/api/measurements/${m.id}`, { version: 1, data: { ...pushrod.data, checkingLength: 7.36 } });
    expect(first.status).toBe(200);
    const stale = await founder.patch(`/api/measurements/${m.id}`, { version: 1, data: { ...pushrod.data, checkingLength: 7.4 } });
    expect(stale.status).toBe(409);
    expect(stale.body.error.message).toMatch(/reload/i);
    expect((await founder.get(`/api/measurements/${m.id}`)).body.measurement.data.checkingLength).toBe(7.36);
  });

  it('keeps shops apart and lets only builder and tech in', async () => {
    const a = await shopWithJob('Shop A');
    const b = await shopWithJob('Shop B');
    const m = (await a.founder.post(`/api/jobs/${a.jobId}/measurements`, pushrod)).body.measurement;
    expect((await b.founder.get(`/api/jobs/${a.jobId}/measurements`)).status).toBe(404);
    expect((await b.founder.post(`/api/jobs/${a.jobId}/measurements`, pushrod)).status).toBe(404);
    expect((await b.founder.post(`/api/jobs/${a.jobId}/measurements/lobes`, csv(lobeRows(6)))).status).toBe(404);
    expect((await b.founder.get(`/api/measurements/${m.id}`)).status).toBe(404);
    expect((await b.founder.patch(`/api/measurements/${m.id}`, { version: 1, note: 'x' })).status).toBe(404);
    expect((await b.founder.delete(`/api/measurements/${m.id}`)).status).toBe(404);
    for (const role of ['customer', 'grinder'] as const) {
      const person = await memberWithRole(t, a.shopId, role);
      expect((await person.get(`/api/jobs/${a.jobId}/measurements`)).status).toBe(403);
      expect((await person.post(`/api/jobs/${a.jobId}/measurements`, pushrod)).status).toBe(403);
      expect((await person.post(`/api/jobs/${a.jobId}/measurements/lobes`, csv(lobeRows(6)))).status).toBe(403);
      expect((await person.get(`/api/measurements/${m.id}`)).status).toBe(403);
      expect((await person.patch(`/api/measurements/${m.id}`, { version: 1, note: 'x' })).status).toBe(403);
      expect((await person.delete(`/api/measurements/${m.id}`)).status).toBe(403);
    }
    expect((await a.founder.get(`/api/measurements/${m.id}`)).body.measurement.version).toBe(1);
  });
});

describe('lobe table upload', () => {
  it('reads the demo lobe table: 16 lobes, every row, with the worn lobe lower than its neighbours', async () => {
    const { shopId, jobId } = await shopWithJob();
    const tech = await memberWithRole(t, shopId, 'tech');
    const text = fs.readFileSync(demoLobesFile, 'utf8');
    const res = await tech.upload(
      `/api/jobs/${jobId}/measurements/lobes`,
      formWith([['file', 'lobes-demo.csv', text, 'text/csv']], { note: 'Old cam on V-blocks' }),
    );
    expect(res.status).toBe(201);
    const m = res.body.measurement;
    expect(m).toMatchObject({ kind: 'lobes', note: 'Old cam on V-blocks', data: { basis: 'crank', fileName: 'lobes-demo.csv' } });
    const lobes = m.data.lobes as { id: string; points: { angle: number; lift: number }[] }[];
    expect(lobes.map((l) => l.id)).toEqual(['1I', '1E', '2I', '2E', '3I', '3E', '4I', '4E', '5I', '5E', '6I', '6E', '7I', '7E', '8I', '8E']);
    const dataLines = text.split('\n').filter((l) => /^-?\d/.test(l));
    for (const l of lobes) expect(l.points).toHaveLength(dataLines.length);
    // Row 3 of the file (after the comment and the header) is the first reading.
    const firstCells = dataLines[0]!.split(',');
    expect(lobes[0]!.points[0]).toEqual({ angle: Number(firstCells[0]), lift: Number(firstCells[1]) });
    const top = (id: string) => Math.max(...lobes.find((l) => l.id === id)!.points.map((p) => p.lift));
    expect(top('2E') - top('3E')).toBeGreaterThan(0.01);
    expect(top('2E') - top('3E')).toBeLessThan(0.014);
  });

  it('refuses a PATCH of a lobe table that the upload would refuse, naming the field, and keeps the stored table', async () => {
    const { founder, jobId } = await shopWithJob();
    const up = await founder.upload(`/api/jobs/${jobId}/measurements/lobes`, csv(lobeRows(6)));
    expect(up.status).toBe(201);
    const { id, data } = up.body.measurement as { id: string; data: { lobes: { id: string; points: { angle: number; lift: number }[] }[] } };
    const [intake, exhaust] = data.lobes as [(typeof data.lobes)[number], (typeof data.lobes)[number]];
    const withLobes = (lobes: unknown) => ({ version: 1, data: { ...data, lobes } });
    const cases: [string, unknown, string][] = [
      ['angles going back', [{ ...intake, points: [...intake.points].reverse() }, exhaust], 'data.lobes.0.points.1.angle'],
      ['lift in millimetres', [intake, { ...exhaust, points: exhaust.points.map((p) => ({ ...p, lift: p.lift * 25.4 + 2 })) }], 'data.lobes.1.points.0.lift'],
      ['negative lift', [{ ...intake, points: intake.points.map((p) => ({ ...p, lift: -0.1 })) }, exhaust], 'data.lobes.0.points.0.lift'],
      ['a lobe named twice', [intake, { ...exhaust, id: intake.id }], 'data.lobes.1.id'],
      ['cylinder 17', [intake, { ...exhaust, id: '17E' }], 'data.lobes.1.id'],
      ['lobes read at other angles', [intake, { ...exhaust, points: exhaust.points.map((p) => ({ ...p, angle: p.angle + 1 })) }], 'data.lobes.1.points'],
    ];
    for (const [what, lobes, field] of cases) {
      const res = await founder.patch(`/api/measurements/${id}`, withLobes(lobes));
      expect(res.status, what).toBe(400);
      expect(Object.keys(res.body.error.fields), what).toContain(field);
    }
    expect((await founder.get(`/api/measurements/${id}`)).body.measurement).toMatchObject({ version: 1, data });
  });

  it('doubles cam_angle to crank degrees and accepts lower-case lobe names', async () => {
    const { founder, jobId } = await shopWithJob();
    const rows = ['cam_angle,3e', '-10,0', '-5,0.1', '0,0.3', '5,0.1', '10,0', '', ''];
    const res = await founder.upload(`/api/jobs/${jobId}/measurements/lobes`, csv(rows));
    expect(res.status).toBe(201);
    expect(res.body.measurement.data).toMatchObject({ basis: 'cam', lobes: [{ id: '3E' }] });
    expect(res.body.measurement.data.lobes[0].points.map((p: { angle: number }) => p.angle)).toEqual([-20, -10, 0, 10, 20]);
  });

  it('refuses a bad cell with its spreadsheet row and column, and saves nothing', async () => {
    const { founder, jobId } = await shopWithJob();
    const columns = ['1I', '1E', '2I', '2E', '3I', '3E'];
    const rows = lobeRows(20, columns);
    // Row 14 of the spreadsheet is rows[13] (the header is row 1); column 3E is the 7th cell.
    const cells = rows[13]!.split(',');
    cells[6] = '0.3o5';
    rows[13] = cells.join(',');
    const before = measurementCount(jobId);
    const res = await founder.upload(`/api/jobs/${jobId}/measurements/lobes`, csv(rows));
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual({ 'row 14, column 3E': 'Lift must be a number in inches' });
    expect(res.body.error.message).toMatch(/^Row 14, column 3E: Lift must be a number in inches.*Nothing was saved/);
    expect(measurementCount(jobId)).toBe(before);
  });

  it('counts blank and comment lines in the row numbers, as a spreadsheet shows them', async () => {
    const { founder, jobId } = await shopWithJob();
    const rows = ['# our own note', '', ...lobeRows(6)];
    rows[5] = '0,0.02,'; // row 6: missing 1E
    const res = await founder.upload(`/api/jobs/${jobId}/measurements/lobes`, csv(rows));
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual({ 'row 6, column 1E': 'Lift is missing: give the lift in inches' });
  });

  it.each([
    ['a duplicate column', ['angle,1I,1E,1I', '0,0,0,0', '2,0,0,0', '4,0,0,0', '6,0,0,0', '8,0,0,0'], 'row 1, column 4', /appears twice/],
    ['an unknown column', ['angle,1I,lift', '0,0,0', '2,0,0', '4,0,0', '6,0,0', '8,0,0'], 'row 1, column 3', /Unknown column "lift"/],
    ['a wrong first column', ['degrees,1I', '0,0', '2,0', '4,0', '6,0', '8,0'], 'row 1, column 1', /angle/],
    ['an angle going back', ['angle,1I', '0,0', '2,0', '4,0', '3,0', '8,0'], 'row 5, column angle', /increase/],
    ['a repeated angle', ['angle,1I', '0,0', '2,0', '2,0', '6,0', '8,0'], 'row 4, column angle', /increase/],
    ['a negative lift', ['angle,1I', '0,0', '2,-0.01', '4,0', '6,0', '8,0'], 'row 3, column 1I', /negative/],
    ['lift in millimetres', ['angle,1I', '0,0', '2,7.7', '4,0', '6,0', '8,0'], 'row 3, column 1I', /millimetres/],
    ['too few rows', ['angle,1I', '0,0', '2,0.1', '4,0'], 'file', /at least 5 rows/],
    ['an empty file', [''], 'file', /header/],
  ])('refuses %s', async (_name, rows, field, message) => {
    const { founder, jobId } = await shopWithJob();
    const res = await founder.upload(`/api/jobs/${jobId}/measurements/lobes`, csv(rows));
    expect(res.status).toBe(400);
    expect(res.body.error.fields[field]).toMatch(message);
    expect(measurementCount(jobId)).toBe(0);
  });

  it('refuses files that are not CSV, too large, or missing', async () => {
    const { founder, jobId } = await shopWithJob();
    const url = `/api/jobs/${jobId}/measurements/lobes`;
    const png = await founder.upload(url, formWith([['file', 'lobes.png', 'angle,1I\n', 'image/png']]));
    expect(png.status).toBe(400);
    expect(png.body.error.fields.file).toMatch(/not a CSV/);
    const binary = await founder.upload(url, formWith([['file', 'lobes.csv', new Uint8Array([0xff, 0xfe, 0xfd, 0x00, 0xc3]), 'text/csv']]));
    expect(binary.status).toBe(400);
    expect(binary.body.error.fields.file).toMatch(/not a text file/i);
    const big = await founder.upload(url, formWith([['file', 'lobes.csv', `angle,1I\n${'0,0\n'.repeat(300_000)}`, 'text/csv']]));
    expect(big.status).toBe(413);
    expect(big.body.error.message).toMatch(/over 1 MB/);
    const none = await founder.upload(url, formWith([], { note: 'no file' }));
    expect(none.status).toBe(400);
    expect(none.body.error.fields.file).toMatch(/Choose a lobe table/);
    const json = await founder.post(url, { rows: [] });
    expect(json.status).toBe(400);
    expect(measurementCount(jobId)).toBe(0);
  });
});
