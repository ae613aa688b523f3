// The build status transition table: every status × every event, written out in full so a
// change to a rule shows here as a changed row.
import { describe, expect, it } from 'vitest';
import { BUILD_STATUSES, becameTested, nextStatus, type BuildEvent, type BuildStatus } from '../../../shared/builds/status';

// rows: status before; columns: upload, record-change, verdict ('refused' = not possible)
const TABLE: Record<BuildStatus, { upload: BuildStatus; 'record-change': BuildStatus; verdict: BuildStatus | 'refused' }> = {
  planned: { upload: 'tested', 'record-change': 'planned', verdict: 'refused' },
  built: { upload: 'tested', 'record-change': 'built', verdict: 'reviewed' },
  tested: { upload: 'tested', 'record-change': 'tested', verdict: 'reviewed' },
  reviewed: { upload: 'reviewed', 'record-change': 'tested', verdict: 'reviewed' },
  discarded: { upload: 'discarded', 'record-change': 'discarded', verdict: 'refused' },
};

describe('nextStatus', () => {
  for (const from of BUILD_STATUSES) {
    for (const kind of ['upload', 'record-change', 'verdict'] as const) {
      const expected = TABLE[from][kind];
      it(`${from} + ${kind} → ${expected}`, () => {
        const result = nextStatus(from, { kind } as BuildEvent);
        if (expected === 'refused') {
          expect(result.ok).toBe(false);
          if (!result.ok) expect(result.reason).toContain(from);
        } else {
          expect(result).toEqual({ ok: true, status: expected, changed: expected !== from, needsReviewer: false });
        }
      });
    }
  }

  it('a new build is built unless its status is named', () => {
    expect(nextStatus(null, { kind: 'create' })).toEqual({ ok: true, status: 'built', changed: true, needsReviewer: false });
    expect(nextStatus(null, { kind: 'create', requested: 'planned' })).toMatchObject({ status: 'planned' });
  });

  it('any status may be set by hand; only "reviewed" needs a reviewer', () => {
    for (const from of BUILD_STATUSES) {
      for (const to of BUILD_STATUSES) {
        expect(nextStatus(from, { kind: 'set', to })).toEqual({ ok: true, status: to, changed: from !== to, needsReviewer: to === 'reviewed' });
      }
    }
  });

  it('says when a build became tested (the moment PIs are told)', () => {
    expect(becameTested('built', 'tested')).toBe(true);
    expect(becameTested('planned', 'tested')).toBe(true);
    expect(becameTested('reviewed', 'tested')).toBe(false); // back to review is told by its own notice
    expect(becameTested('discarded', 'tested')).toBe(false); // a restore
    expect(becameTested('tested', 'tested')).toBe(false);
  });
});
