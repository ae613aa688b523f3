// A build's status and the one function that moves it: planned → built → tested → reviewed, or
// discarded. Every place that sets a status (creating, editing, uploading a curve, changing the
// curve of record, giving a verdict) asks `nextStatus`. Pure: no I/O.
import { BUILD_STATUSES, type BuildStatus } from '../schemas/build';

export { BUILD_STATUSES, type BuildStatus };

/** What happened to the build. */
export type BuildEvent =
  /** a new build; `requested` when the caller names its status (default: built) */
  | { kind: 'create'; requested?: BuildStatus }
  /** a person sets the status by hand (the build form, Discard, Restore) */
  | { kind: 'set'; to: BuildStatus }
  /** a curve was stored on the build */
  | { kind: 'upload' }
  /** the build's curve of record changed (chosen, or the record deleted) */
  | { kind: 'record-change' }
  /** a PI gave a verdict (approved or needs work) */
  | { kind: 'verdict' };

export type StatusStep =
  | {
      ok: true;
      status: BuildStatus;
      changed: boolean;
      /** set when only a person with the review permission may make this step */
      needsReviewer: boolean;
    }
  | { ok: false; reason: string };

const DEFAULT_NEW: BuildStatus = 'built';

const step = (from: BuildStatus | null, to: BuildStatus, needsReviewer = false): StatusStep => ({ ok: true, status: to, changed: from !== to, needsReviewer });

/**
 * The status after an event, or why the event is not possible.
 * - create: the requested status, else built (the build form may record a build made earlier at any stage)
 * - set: any status (reviewed only by a reviewer: it is what a verdict sets)
 * - upload: planned or built → tested; later statuses stay
 * - record-change: reviewed → tested (the values a verdict judged have moved); others stay
 * - verdict: → reviewed, refused on planned and discarded builds (nothing made and tested to judge)
 * @example nextStatus('built', { kind: 'upload' }) // { ok: true, status: 'tested', changed: true, needsReviewer: false }
 */
export function nextStatus(from: BuildStatus | null, event: BuildEvent): StatusStep {
  switch (event.kind) {
    case 'create':
      return step(null, event.requested ?? DEFAULT_NEW);
    case 'set':
      return step(from, event.to, event.to === 'reviewed');
    case 'upload':
      return from === 'planned' || from === 'built' ? step(from, 'tested') : step(from, from ?? 'tested');
    case 'record-change':
      return from === 'reviewed' ? step(from, 'tested') : step(from, from ?? DEFAULT_NEW);
    case 'verdict':
      if (from === 'planned' || from === 'discarded') return { ok: false, reason: `a verdict needs a build that was made and tested, and this one is ${from}` };
      return step(from, 'reviewed');
  }
}

/** Did this step bring the build to "tested" from before it (the moment the PIs are told)? */
export function becameTested(from: BuildStatus, to: BuildStatus): boolean {
  return to === 'tested' && (from === 'planned' || from === 'built');
}
