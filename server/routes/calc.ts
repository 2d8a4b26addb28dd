import { Router, type RequestHandler } from 'express';
import { rateLimit } from 'express-rate-limit';

import { analysisToJson, createAnalysisWorkspace, type ProfileAnalysis } from '@/calc/analysis';
import { analyzeRecords } from '@/shared/analysis';
import { calcAnalyzeSchema, type CalcAnalyzeResponse } from '@/shared/calc-api';

import { requireSignedIn } from '../access';
import { declareCalcFields, renamePrefixes } from '../calc-fields';
import type { AppDeps } from '../deps';
import { HttpError, parse, sendError } from '../http';
import { databaseRateLimitStore } from '../store/rate-limits';

export type CalcRateLimit = {
  /** Analyses requests one person may make per window. */
  limit: number;
  /** Window length, milliseconds. */
  windowMs: number;
};

export const defaultCalcRateLimit: CalcRateLimit = { limit: 60, windowMs: 60_000 };

/** Copies an analysis without its sampled curves (every Float64Array). */
function withoutCurves(value: unknown): unknown {
  if (Array.isArray(value)) return value.map(withoutCurves);
  if (value !== null && typeof value === 'object') {
    const out: Record<string, unknown> = {};
    for (const [k, v] of Object.entries(value)) {
      if (v instanceof Float64Array) continue;
      out[k] = withoutCurves(v);
    }
    return out;
  }
  return value;
}

/**
 * `POST /api/calc/analyze`: the JSON calc API for integrations. Any signed-in
 * person may call it, within a per-person rate limit.
 */
export function calcRouter({ auth, db }: AppDeps, rate: CalcRateLimit = defaultCalcRateLimit) {
  const router = Router();

  const signedIn: RequestHandler = async (req, res, next) => {
    const signed = await requireSignedIn(auth, db, req);
    res.locals.userId = signed.user.id;
    next();
  };

  const limiter = rateLimit({
    store: databaseRateLimitStore(db, 'calc:'),
    windowMs: rate.windowMs,
    limit: rate.limit,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    keyGenerator: (_req, res) => `user:${String(res.locals.userId)}`,
    handler: (_req, res) => {
      const minutes = Math.max(1, Math.round(rate.windowMs / 60_000));
      sendError(
        res,
        new HttpError(
          429,
          'rate_limited',
          `Too many analyses: the limit is ${rate.limit} per ${minutes === 1 ? 'minute' : `${minutes} minutes`}. Wait a moment and try again.`,
        ),
      );
    },
  });

  router.post('/calc/analyze', signedIn, limiter, (req, res) => {
    const { engine, profiles, ptvBaseline, regrind, core, grinding, limits, curves } = parse(calcAnalyzeSchema, req.body);
    const workspace = createAnalysisWorkspace();
    const analyses = profiles.map((spec, i) => {
      // A calc error names the profile of the list it came from.
      declareCalcFields(
        res,
        renamePrefixes([
          ['regrind.regrindBaseCircle', `profiles.${i}.baseCircle`],
          ['profile', `profiles.${i}`],
        ]),
      );
      const analysis: ProfileAnalysis = analyzeRecords(engine, spec, { ptvBaseline, regrind, core, grinding, limits }, workspace);
      // The workspace's curves are overwritten by the next profile, so copy out now.
      return curves ? analysisToJson(analysis) : withoutCurves(analysis);
    });
    res.json({ analyses } as CalcAnalyzeResponse);
  });

  return router;
}
