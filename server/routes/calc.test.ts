import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { analysisToJson, analyzeProfile, type AnalysisInput } from '@/calc/analysis';
import { DEMO_ANALYSIS_INPUT, DEMO_CORE, DEMO_ENGINE, DEMO_GRINDING, DEMO_STOCK_REGRIND, DEMO_TOWING } from '@/calc/demo';
import { createTestApp, makeEngineSpec, makeProfileSpec, makeShop, signUp, type TestApp } from '@/tests/fixtures';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

const stock = makeProfileSpec({ ...DEMO_STOCK_REGRIND, intake: { ...DEMO_STOCK_REGRIND.intake }, exhaust: { ...DEMO_STOCK_REGRIND.exhaust } });
const towing = makeProfileSpec();
const extras = { ptvBaseline: DEMO_ANALYSIS_INPUT.ptvBaseline, regrind: DEMO_ANALYSIS_INPUT.regrind };

/** Calc called directly, through JSON like the API answer. */
function direct(input: AnalysisInput) {
  return JSON.parse(JSON.stringify(analysisToJson(analyzeProfile(input))));
}

describe('POST /api/calc/analyze', () => {
  it('answers what calc gives when called directly, one analysis per profile in order', async () => {
    const { founder } = await makeShop(t, 'repair', 'Calc shop');
    const res = await founder.post('/api/calc/analyze', { engine: makeEngineSpec(), profiles: [stock, towing], ...extras });
    expect(res.status).toBe(200);
    expect(res.body.analyses).toHaveLength(2);
    expect(res.body.analyses[0]).toEqual(direct({ engine: DEMO_ENGINE, profile: DEMO_STOCK_REGRIND, ...extras }));
    expect(res.body.analyses[1]).toEqual(direct({ engine: DEMO_ENGINE, profile: DEMO_TOWING, ...extras }));
    expect(res.body.analyses[1].ptv.intake).not.toBeNull();
    expect(res.body.analyses[1].preload).not.toBeNull();
    expect(res.body.analyses[1].intake.curve.lift.length).toBe(res.body.analyses[1].intake.curve.count);
  });

  it('answers whether the profile fits the core when given the core and the grinding numbers', async () => {
    const person = await signUp(t, 'Core caller');
    const body = { engine: makeEngineSpec(), profiles: [towing], ...extras, core: DEMO_CORE, grinding: DEMO_GRINDING };
    const res = await person.post('/api/calc/analyze', body);
    expect(res.status).toBe(200);
    const expected = direct({ engine: DEMO_ENGINE, profile: DEMO_TOWING, ...extras, core: DEMO_CORE, grinding: DEMO_GRINDING });
    expect(res.body.analyses[0]).toEqual(expected);
    expect(res.body.analyses[0].feasibility.cut).toBeCloseTo(0.04, 12);
    expect(res.body.analyses[0].feasibility.exhaust.envelope.margin).toHaveLength(360);
    const bad = await person.post('/api/calc/analyze', { ...body, grinding: { rollerDiameter: 'big' } });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields)).toEqual(['grinding.rollerDiameter']);
  });

  it("applies the caller's check limits", async () => {
    const person = await signUp(t, 'Limits caller');
    const limits = { coilBind: { min: 0.5 }, dynamicCompression: { max: 7, source: 'Integration test rule' } };
    const res = await person.post('/api/calc/analyze', { engine: makeEngineSpec(), profiles: [towing], limits });
    expect(res.status).toBe(200);
    expect(res.body.analyses[0]).toEqual(direct({ engine: DEMO_ENGINE, profile: DEMO_TOWING, limits }));
    expect(res.body.analyses[0].limits.coilBind).toMatchObject({ min: 0.5, source: 'shop setting' });
    expect(res.body.analyses[0].limits.dynamicCompression).toMatchObject({ max: 7, source: 'Integration test rule' });
  });

  it('leaves out the sampled curves when asked, and nothing else', async () => {
    const person = await signUp(t, 'Curve-free caller');
    const res = await person.post('/api/calc/analyze', { engine: makeEngineSpec(), profiles: [towing], ...extras, curves: false });
    expect(res.status).toBe(200);
    const expected = direct({ engine: DEMO_ENGINE, profile: DEMO_TOWING, ...extras });
    for (const side of ['intake', 'exhaust']) {
      for (const k of ['lift', 'velocity', 'acceleration']) delete expected[side].curve[k];
      delete expected.ptv[side].clearance;
    }
    for (const k of ['depth', 'velocity', 'acceleration']) delete expected.piston[k];
    expect(res.body.analyses[0]).toEqual(expected);
    expect(JSON.stringify(res.body).length).toBeLessThan(JSON.stringify(direct({ engine: DEMO_ENGINE, profile: DEMO_TOWING })).length / 4);
  });

  it('is open to any signed-in person, whatever their shop or role', async () => {
    const { founder: grinder } = await makeShop(t, 'grinding', 'Calc grinder');
    const noShop = await signUp(t, 'No shop yet');
    for (const person of [grinder, noShop]) {
      const res = await person.post('/api/calc/analyze', { engine: makeEngineSpec(), profiles: [towing] });
      expect(res.status).toBe(200);
    }
  });

  it('answers 401 when nobody is signed in', async () => {
    const res = await fetch(`${t.url}/api/calc/analyze`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ engine: makeEngineSpec(), profiles: [towing] }),
    });
    expect(res.status).toBe(401);
    expect(await res.json()).toMatchObject({ error: { code: 'unauthenticated' } });
  });

  it('answers a bad body with a 400 that names each field', async () => {
    const person = await signUp(t, 'Careless caller');
    const engine = makeEngineSpec({ spring: { ...makeEngineSpec().spring, coilBindHeight: 1.95 } });
    const res = await person.post('/api/calc/analyze', {
      engine,
      profiles: [towing, makeProfileSpec({ intake: { ...towing.intake, duration050: 500 } })],
      ptvBaseline: { intake: { clearance: -1 } },
      regrind: { originalPreload: 0.04 },
      limits: { coilBind: { min: 'close' }, springSurge: {} },
      curves: 'yes',
      law: 'poly345',
    });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid');
    expect(res.body.error.fields).toMatchObject({
      'engine.spring.coilBindHeight': 'Coil-bind height must be below the installed height',
      'profiles.1.intake.duration050': expect.stringMatching(/between 120 and 330/),
      'ptvBaseline.intake.clearance': expect.stringMatching(/between 0 and 2/),
      'regrind.stockBaseCircle': expect.any(String),
      'limits.coilBind.min': expect.any(String),
      'limits.springSurge': 'Unknown field',
      curves: 'curves is true or false',
      law: 'Unknown field',
    });
    for (const profiles of [[], [towing, towing, towing, towing]]) {
      const count = await person.post('/api/calc/analyze', { engine: makeEngineSpec(), profiles });
      expect(count.status).toBe(400);
      expect(Object.keys(count.body.error.fields)).toEqual(['profiles']);
    }
  });

  it('turns a calc input error into a 400 naming the field of the request', async () => {
    const person = await signUp(t, 'Calc-error caller');
    const lash = await person.post('/api/calc/analyze', {
      engine: makeEngineSpec(),
      profiles: [towing, makeProfileSpec({ exhaust: { ...towing.exhaust, lash: 0.02 } })],
    });
    expect(lash.status).toBe(400);
    expect(lash.body.error).toMatchObject({ code: 'invalid_input', message: expect.stringMatching(/^profiles\.1\.exhaust\.lash: /) });
    expect(Object.keys(lash.body.error.fields)).toEqual(['profiles.1.exhaust.lash']);

    const grown = await person.post('/api/calc/analyze', {
      engine: makeEngineSpec(),
      profiles: [towing],
      regrind: { originalPreload: 0.04, stockBaseCircle: 1.1 },
    });
    expect(grown.status).toBe(400);
    expect(Object.keys(grown.body.error.fields)).toEqual(['profiles.0.baseCircle']);
    expect(grown.body.error.fields['profiles.0.baseCircle']).toMatch(/stockBaseCircle/);
  });
});

describe('calc API rate limit', () => {
  let limited: TestApp;
  beforeAll(async () => {
    limited = await createTestApp({ calcRateLimit: { limit: 3, windowMs: 60_000 } });
  });
  afterAll(() => limited.close());

  it('answers 429 in the usual error shape past the limit, counting each person apart', async () => {
    const body = { engine: makeEngineSpec(), profiles: [towing], curves: false };
    const first = await signUp(limited, 'Busy integration');
    for (let i = 0; i < 3; i += 1) expect((await first.post('/api/calc/analyze', body)).status).toBe(200);
    const over = await first.post('/api/calc/analyze', body);
    expect(over.status).toBe(429);
    expect(over.body).toEqual({ error: { code: 'rate_limited', message: expect.stringMatching(/3 per minute/) } });
    // Bad bodies count as well: the limit is on requests, not on successes.
    expect((await first.post('/api/calc/analyze', {})).status).toBe(429);

    const second = await signUp(limited, 'Quiet integration');
    expect((await second.post('/api/calc/analyze', body)).status).toBe(200);
    // Other routes are not limited.
    expect((await first.get('/api/me')).status).toBe(200);
  });
});
