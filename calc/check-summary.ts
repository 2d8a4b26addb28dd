/**
 * The one summary of a list of check results (Pass only when every check ran and passed).
 * Kept apart from the rules in ./checks.ts, which re-exports it, so a screen that only shows
 * results does not load the rules and the lobe-table code they use.
 */
import type { CheckStatus, SkippedCheck } from './checks';
import { CalcInputError, requireObject } from './errors';

/** The worst status in a list: fail over watch over pass. */
export function worstStatus(results: readonly { status: CheckStatus }[]): CheckStatus {
  if (!Array.isArray(results)) throw new CalcInputError('results', 'must be a list of check results', results);
  let worst: CheckStatus = 'pass';
  for (const r of results) {
    if (r === null || typeof r !== 'object' || (r.status !== 'pass' && r.status !== 'watch' && r.status !== 'fail')) {
      throw new CalcInputError('results', 'every result needs a status of pass, watch or fail', r);
    }
    if (r.status === 'fail') return 'fail';
    if (r.status === 'watch') worst = 'watch';
  }
  return worst;
}

/** A summary's status: a check verdict when every check ran, else "incomplete" unless what ran already watches or fails. */
export type SummaryStatus = CheckStatus | 'incomplete';

export interface CheckSummary {
  /** The worst verdict when every check ran; with checks still to run, "incomplete" unless one that ran is watch or fail. */
  status: SummaryStatus;
  /** The worst verdict among the checks that ran (pass when none ran). */
  worst: CheckStatus;
  /** Checks that ran. */
  ran: number;
  /** Checks that apply: those that ran and those not run (a check that does not apply is left out). */
  total: number;
  /** True when every check that applies ran. */
  complete: boolean;
  /** The summary in words: "Pass", "Fail", or "5 of 8 checks run", "Fail · 5 of 8 checks run". */
  label: string;
}

const VERDICT_WORDS: Record<CheckStatus, string> = { pass: 'Pass', watch: 'Watch', fail: 'Fail' };

/**
 * The one summary of a list of check results: it reads Pass only when every
 * check ran and passed; otherwise it says how many ran ("5 of 8 checks run"),
 * after the worst verdict when one that ran watches or fails.
 */
export function summarizeChecks(input: { checks: readonly { status: CheckStatus }[]; skipped: readonly SkippedCheck[] }): CheckSummary {
  requireObject('input', input);
  if (!Array.isArray(input.skipped)) throw new CalcInputError('skipped', 'must be a list of checks not run', input.skipped);
  const worst = worstStatus(input.checks);
  const ran = input.checks.length;
  const total = ran + input.skipped.filter((s) => !s.notApplicable).length;
  const complete = ran > 0 && ran === total;
  const count = ran === 0 ? 'No checks run yet' : `${ran} of ${total} checks run`;
  return {
    status: complete ? worst : worst === 'pass' ? 'incomplete' : worst,
    worst,
    ran,
    total,
    complete,
    label: complete ? VERDICT_WORDS[worst] : worst === 'pass' ? count : `${VERDICT_WORDS[worst]} · ${count}`,
  };
}
