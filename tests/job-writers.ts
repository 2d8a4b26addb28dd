import { Client, makeJobBody } from './fixtures';

/** A job the server answered 2xx for: created, and maybe edited. */
export type AckedJob = { id: string; vehicle: string; findings?: string; version: number };

/** Signs a new builder up on a running server and gives them a repair shop of their own. */
export async function builderWithShop(url: string, email: string): Promise<Client> {
  const builder = new Client(url);
  const signUp = await builder.post('/api/auth/sign-up/email', { name: 'Load Builder', email, password: 'correct-horse-9' });
  if (signUp.status !== 200) throw new Error(`sign-up failed: ${signUp.status} ${JSON.stringify(signUp.body)}`);
  const shop = await builder.post('/api/shops', { name: 'Load test shop', kind: 'repair' });
  if (shop.status !== 201) throw new Error(`shop failed: ${shop.status} ${JSON.stringify(shop.body)}`);
  return builder;
}

/**
 * Parallel writers that each create a job and then edit it once, over and
 * over, as fast as the server answers. `acked` holds what the server
 * acknowledged; after `stop()` a failed request ends its writer quietly
 * (the server may be gone), before it any failure rejects `done`.
 */
export function startJobWriters(builder: Client, writers: number) {
  const acked = new Map<string, AckedJob>();
  let sent = 0;
  let inFlight = 0;
  let stopped = false;
  const write = async <T>(request: () => Promise<T>) => {
    inFlight += 1;
    try {
      return await request();
    } finally {
      inFlight -= 1;
    }
  };
  async function writer(w: number) {
    while (!stopped) {
      const n = sent++;
      try {
        const vehicle = `Load flatbed ${w}-${n}`;
        const created = await write(() => builder.post('/api/jobs', makeJobBody({ vehicle })));
        if (created.status !== 201) throw new Error(`create answered ${created.status}`);
        const job: AckedJob = { id: created.body.job.id, vehicle, version: created.body.job.version };
        acked.set(job.id, job);
        const findings = `Lobe 3E worn, edit ${n}`;
        const edited = await write(() => builder.patch(`/api/jobs/${job.id}`, { version: job.version, findings }));
        if (edited.status !== 200) throw new Error(`edit answered ${edited.status}`);
        acked.set(job.id, { ...job, findings, version: edited.body.job.version });
      } catch (error) {
        if (!stopped) throw error;
      }
    }
  }
  const done = Promise.all(Array.from({ length: writers }, (_, w) => writer(w))).then(() => undefined);
  return {
    acked,
    inFlight: () => inFlight,
    stop: () => {
      stopped = true;
    },
    done,
    /** Resolves once `count` jobs are acknowledged. */
    until: async (count: number) => {
      while (acked.size < count) await Promise.race([done, new Promise((r) => setTimeout(r, 5))]);
    },
  };
}

/** Acknowledged jobs missing from `saved`, or saved without their acknowledged edit. */
export function lostWrites(acked: Iterable<AckedJob>, saved: { id: string; vehicle: string; findings: string; version: number }[]) {
  const byId = new Map(saved.map((j) => [j.id, j]));
  return [...acked].filter((job) => {
    const row = byId.get(job.id);
    if (!row || row.vehicle !== job.vehicle) return true;
    return job.findings !== undefined && (row.findings !== job.findings || row.version < job.version);
  });
}
