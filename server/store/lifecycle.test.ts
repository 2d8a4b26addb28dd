import { describe, expect, it } from 'vitest';

import type { LifecycleFacts } from '@/shared/lifecycle';

import { jobLifecycle } from './lifecycle';

const none: LifecycleFacts = {
  findings: false,
  firstMeasurementAt: null,
  firstLinkAt: null,
  approval: null,
  order: null,
  otherOrders: 0,
  degreedAt: null,
  check: null,
  returned: false,
};

describe('jobLifecycle', () => {
  it('marks a stage done only by its own record, whatever is missing before it', () => {
    const l = jobLifecycle({ ...none, returned: true });
    expect(l.stages.filter((s) => s.done).map((s) => s.key)).toEqual(['returned']);
    expect(l.next).toBe('findings');
  });

  it('holds installed until the order is installed and the cam degreed, dated by the later of the two', () => {
    const order = {
      at: '2026-01-01T00:00:00.000Z',
      confirmedReason: null,
      grinderName: 'G',
      revisionNumber: 2,
      checksum: 'abc',
      movedAt: { installed: '2026-01-05T00:00:00.000Z' },
    };
    const degreedOnly = jobLifecycle({ ...none, degreedAt: '2026-01-06T00:00:00.000Z' }).stages.find((s) => s.key === 'installed');
    expect(degreedOnly).toMatchObject({ done: false, detail: 'Degreed; the order is not marked installed' });
    const both = jobLifecycle({ ...none, order, degreedAt: '2026-01-06T00:00:00.000Z' }).stages.find((s) => s.key === 'installed');
    expect(both).toMatchObject({ done: true, at: '2026-01-06T00:00:00.000Z', detail: null });
  });

  it('counts the owner step as skipped, with the reason, when a builder confirmed the firm order without the owner', () => {
    const order = { at: 'b', confirmedReason: 'Fleet account', grinderName: 'G', revisionNumber: 3, checksum: 'abc', movedAt: {} };
    const approved = jobLifecycle({ ...none, order }).stages.find((s) => s.key === 'approved');
    expect(approved).toMatchObject({ done: true, at: 'b', detail: 'Skipped: the shop confirmed revision 3 without the owner (Fleet account)' });
    expect(jobLifecycle(none).stages.find((s) => s.key === 'approved')).toMatchObject({ done: false, detail: null });
  });

  it('has no next stage once every stage is done', () => {
    const order = {
      at: 'a',
      confirmedReason: null,
      grinderName: 'G',
      revisionNumber: 1,
      checksum: 'abc',
      movedAt: { shipped: 'b', received: 'c', installed: 'd' },
    };
    const all = jobLifecycle({
      findings: true,
      firstMeasurementAt: 'a',
      firstLinkAt: 'a',
      approval: { at: 'a', name: 'N', optionTitle: 'T', revisionNumber: 1, checksum: 'abc' },
      order,
      otherOrders: 0,
      degreedAt: 'e',
      check: { at: 'f', by: null, label: 'Pass' },
      returned: true,
    });
    expect(all.next).toBeNull();
    expect(all.stages.every((s) => s.done)).toBe(true);
    expect(all.stages.find((s) => s.key === 'checked')?.detail).toBe('Pass');
  });
});
