/**
 * A job's way from teardown to the owner, as one list of stages worked out from the job's own records (never
 * typed in): what teardown found, the measurements, the options sent to the owner, their approval, the firm
 * grind order on the approved revision and its moves, the cam degreed on the engine, the fit checks run against
 * the approved revision, and the job marked back with the owner.
 */
export const lifecycleStages = ['findings', 'measured', 'offered', 'approved', 'ordered', 'shipped', 'received', 'installed', 'checked', 'returned'] as const;
export type LifecycleStageKey = (typeof lifecycleStages)[number];

export const lifecycleStageLabels: Record<LifecycleStageKey, string> = {
  findings: 'Findings written',
  measured: 'Measured',
  offered: 'Options offered',
  approved: 'Owner approved',
  ordered: 'Ordered',
  shipped: 'Ground and shipped',
  received: 'Received',
  installed: 'Installed and degreed',
  checked: 'Checked on the engine',
  returned: 'Back with the owner',
};

/** One stage: done or not, when (ISO time, null when the records keep no time for it), and a line of what it holds. */
export type LifecycleStage = { key: LifecycleStageKey; label: string; done: boolean; at: string | null; detail: string | null };

/** The stages in order, and the first one not yet done (null once every stage is). */
export type Lifecycle = { stages: LifecycleStage[]; next: LifecycleStageKey | null };

/** The records a job's lifecycle is read from. Times are ISO strings; anything not there yet is null. */
export type LifecycleFacts = {
  findings: boolean;
  firstMeasurementAt: string | null;
  firstLinkAt: string | null;
  approval: { at: string; name: string; optionTitle: string; revisionNumber: number; checksum: string } | null;
  /** The firm order: the one on the approved revision, or the one a builder confirmed without the owner (`confirmedReason`). */
  order: {
    at: string;
    confirmedReason: string | null;
    grinderName: string;
    revisionNumber: number;
    checksum: string;
    movedAt: Partial<Record<'shipped' | 'received' | 'installed', string>>;
  } | null;
  /** Other orders on the job (requests to quote, or superseded), by count. */
  otherOrders: number;
  /** The newest degree-wheel reading. */
  degreedAt: string | null;
  /** The newest fit-check run against the approved revision. */
  check: { at: string; by: string | null; label: string } | null;
  returned: boolean;
};
