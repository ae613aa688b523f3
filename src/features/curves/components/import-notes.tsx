// What was done to a curve's file on the way in (sign flipped, lines left out after the table,
// HFR zeros read as missing, area read from dimensions …) and the conditions on which the file
// and the build's record differ, each with a choice of which one is right.
import { useState } from 'react';
import type { CurveSummary } from '@shared/api-types';
import type { ConditionMismatch } from '@shared/curves/compare-conditions';
import { useCurve } from '../api/curves';
import { useChooseCondition } from '../api/choose-condition';
import { Button } from '@/components/ui/button';
import { ErrorNote } from '@/components/ui/panel';

const SHOWN_NOTES = 4;

function importNotesOf(curve: CurveSummary): string[] {
  const notes = curve.summary.importNotes;
  return Array.isArray(notes) ? notes.filter((note): note is string => typeof note === 'string') : [];
}

function mismatchesOf(curve: CurveSummary): ConditionMismatch[] {
  const list = curve.summary.conditionMismatches;
  return Array.isArray(list) ? (list as ConditionMismatch[]) : [];
}

function sideText(mismatch: ConditionMismatch, side: 'file' | 'build'): string {
  const value = side === 'file' ? mismatch.fileValue : mismatch.buildValue;
  const stated = side === 'file' ? mismatch.fileStated : mismatch.buildStated;
  const plain = mismatch.unit ? `${typeof value === 'number' ? value.toLocaleString('en-GB', { maximumFractionDigits: 3 }) : value} ${mismatch.unit}` : String(value);
  if (stated === undefined || stated === '') return plain;
  return mismatch.field === 'areaCm2' ? `${stated} = ${plain}` : `${stated} (${plain})`;
}

function MismatchRow({ curve, mismatch, buildId, canChoose }: { curve: CurveSummary; mismatch: ConditionMismatch; buildId: number; canChoose: boolean }) {
  const choose = useChooseCondition(buildId);
  const [changing, setChanging] = useState(false);
  const chosen = mismatch.chosen;
  const open = canChoose && (chosen === undefined || changing);
  const send = (side: 'file' | 'build') => choose.mutate({ curveId: curve.id, field: mismatch.field, chosen: side }, { onSuccess: () => setChanging(false) });
  return (
    <div role="listitem" className="py-1.5">
      <div className="grid gap-x-4 gap-y-0.5 sm:grid-cols-[9rem_minmax(0,20rem)_minmax(0,20rem)]">
        <span className="text-xs font-medium text-ink-900">{mismatch.label}</span>
        <span className="text-xs text-ink-800"><span className="text-ink-500">file: </span><span className="num">{sideText(mismatch, 'file')}</span>{chosen === 'file' && <span className="ml-1 text-moss-700">✓ chosen</span>}</span>
        <span className="text-xs text-ink-800"><span className="text-ink-500">build record: </span><span className="num">{sideText(mismatch, 'build')}</span>{chosen === 'build' && <span className="ml-1 text-moss-700">✓ chosen</span>}</span>
      </div>
      {open ? (
        <div className="mt-1 flex flex-wrap items-center gap-2">
          <Button className="px-2 py-0.5 text-xs" disabled={choose.isPending} onClick={() => send('file')}>The file is right</Button>
          <Button className="px-2 py-0.5 text-xs" disabled={choose.isPending} onClick={() => send('build')}>The build record is right</Button>
          {mismatch.field === 'areaCm2' && <span className="text-[11px] text-ink-500">Another area re-converts total current and HFR and measures the curve again.</span>}
          {changing && <Button variant="ghost" className="px-2 py-0.5 text-xs" onClick={() => setChanging(false)}>Cancel</Button>}
        </div>
      ) : chosen !== undefined ? (
        <p className="mt-0.5 text-[11px] text-ink-500">
          {chosen === 'file' ? 'The build record now holds the file’s value.' : 'The build record was kept; the file’s value is not used.'}
          {canChoose && <button type="button" className="ml-2 text-copper-700 underline" onClick={() => setChanging(true)}>Change</button>}
        </p>
      ) : (
        <p className="mt-0.5 text-[11px] text-amber-700">Not settled yet: the uploader, a researcher or a PI chooses which is right.</p>
      )}
      <ErrorNote error={choose.error} />
    </div>
  );
}

/**
 * The import notes and condition mismatches of a stored curve. Its lists are role="list"
 * blocks rather than <ul>: they sit inside the upload rows' own <li> list. Renders nothing when the file
 * went in as it was and agrees with the build.
 */
export function ImportNotes({ curve, buildId, canChoose }: { curve: CurveSummary; buildId?: number; canChoose: boolean }) {
  const [all, setAll] = useState(false);
  const notes = importNotesOf(curve);
  const mismatches = mismatchesOf(curve);
  if (notes.length === 0 && mismatches.length === 0) return null;
  const shown = all ? notes : notes.slice(0, SHOWN_NOTES);
  const unsettled = mismatches.filter((mismatch) => mismatch.chosen === undefined).length;
  return (
    <section className="mt-3 rounded-md border border-line bg-paper/60 px-3 py-2" aria-label={`How ${curve.label || 'the file'} was read`}>
      {mismatches.length > 0 && (
        <div className="mb-2">
          <h3 className="text-xs font-semibold text-ink-900">
            <span aria-hidden="true" className="mr-1 text-amber-700">▲</span>
            The file and the build’s record differ{unsettled > 0 ? ` (${unsettled} to settle)` : ''}
          </h3>
          <div role="list" className="divide-y divide-line">
            {mismatches.map((mismatch) => <MismatchRow key={mismatch.field} curve={curve} mismatch={mismatch} buildId={buildId ?? curve.buildId} canChoose={canChoose} />)}
          </div>
        </div>
      )}
      {notes.length > 0 && (
        <div>
          <h3 className="text-xs font-semibold text-ink-900">How the file was read</h3>
          <div role="list" className="mt-0.5 space-y-0.5 text-xs text-ink-700">
            {shown.map((note, index) => (
              <p role="listitem" key={index} className="break-words pl-3 -indent-3"><span aria-hidden="true">· </span>{note}</p>
            ))}
          </div>
          {notes.length > SHOWN_NOTES && (
            <button type="button" className="mt-0.5 text-[11px] text-copper-700 underline" onClick={() => setAll((value) => !value)}>
              {all ? 'Show fewer' : `Show all ${notes.length} notes`}
            </button>
          )}
        </div>
      )}
    </section>
  );
}

/** The same, for a curve known by its id only (an upload row): fetched once stored. */
export function ImportNotesFor({ curveId, buildId, canChoose }: { curveId: number; buildId: number; canChoose: boolean }) {
  const curve = useCurve(curveId, { maxPoints: 200 });
  if (!curve.data) return null;
  return <ImportNotes curve={curve.data.curve} buildId={buildId} canChoose={canChoose} />;
}
