// What a person sees once a curve is stored: a link to the build, the new curve's metrics beside
// the build's curve of record (same reference point), and the choice between the two when the
// new curve is not the first of its kind. Nothing about the build changes until someone chooses.
import { useState } from 'react';
import { Link } from 'react-router-dom';
import type { CurveSummary, ProjectSettings } from '@shared/api-types';
import { ApiError } from '@/lib/api-client';
import { Button } from '@/components/ui/button';
import { METRICS, formatMetric } from '@/lib/format';
import { useChooseRecord } from '../api/curves';
import { COMPARED, KIND_WORD, RecordMark, formatDifference, referenceLine } from './record-parts';
import { ImportNotesFor } from './import-notes';

export interface StoredUpload {
  curve: CurveSummary;
  recordCurve: CurveSummary | null;
}

const label = (c: CurveSummary) => c.label || `curve ${c.id}`;

export function UploadResult({ stored, projectId, buildCode, settings }: { stored: StoredUpload; projectId: number; buildCode: string; settings: ProjectSettings | null }) {
  const { curve, recordCurve } = stored;
  const choose = useChooseRecord(projectId);
  const [decision, setDecision] = useState<{ kind: 'chosen' | 'kept'; message: string } | null>(null);
  const buildLink = `/projects/${projectId}/builds/${curve.buildId}`;
  const isFirst = curve.isRecord || !recordCurve || recordCurve.id === curve.id;
  const keys = COMPARED[curve.kind];
  const sameReference = !recordCurve || recordCurve.metricsVersion === curve.metricsVersion;

  const makeRecord = () => {
    choose.mutate(
      { buildId: curve.buildId, kind: curve.kind, curveId: curve.id },
      { onSuccess: (answer) => setDecision({ kind: 'chosen', message: answer.record.message }) },
    );
  };
  const keep = () => setDecision({ kind: 'kept', message: `Kept “${label(recordCurve!)}” as the ${KIND_WORD[curve.kind]} of record of ${buildCode}. The new curve stays on the build page, where it can be chosen later.` });

  return (
    <div className="mt-2 rounded-md border border-line bg-paper/40 p-3 text-sm" aria-label={`Result for ${label(curve)}`} role="group">
      <p className="flex flex-wrap items-center gap-x-3 gap-y-1 text-ink-800">
        <span>Stored on <b>{buildCode}</b>: {curve.kind} curve, {curve.pointCount.toLocaleString('en-GB')} points.</span>
        <Link to={buildLink} className="font-medium text-copper-700 underline">Open {buildCode}</Link>
      </p>
      {isFirst ? (
        <>
          <p className="mt-1 flex flex-wrap items-center gap-2 text-xs text-ink-700">
            <RecordMark /> The first {KIND_WORD[curve.kind]} of {buildCode}: its metrics are now the build’s values.
          </p>
          <MetricTable keys={keys} columns={[{ title: 'This upload', curve }]} />
        </>
      ) : (
        <>
          <p className="mt-1 text-xs text-ink-700">
            {buildCode} already has a {KIND_WORD[curve.kind]} of record, “{label(recordCurve!)}”. Its values — on the home page, in the builds table, gains, lineage and the surface — stay as they are until someone chooses.
          </p>
          <MetricTable
            keys={keys}
            columns={[{ title: 'This upload', curve }, { title: 'Curve of record', curve: recordCurve! }]}
            difference
          />
        </>
      )}
      <p className="mt-1 text-[11px] text-ink-500">
        {settings ? `At the project’s reference point: ${referenceLine(settings)}.` : null}
        {!sameReference && <span className="text-amber-700"> The two were measured at different reference points; the record is being re-measured.</span>}
      </p>
      <ImportNotesFor curveId={curve.id} buildId={curve.buildId} canChoose />
      {!isFirst && !decision && (
        <div className="mt-2 flex flex-wrap gap-2">
          <Button variant="primary" disabled={choose.isPending} onClick={makeRecord}>Make this the curve of record</Button>
          <Button disabled={choose.isPending} onClick={keep}>Keep the current record</Button>
        </div>
      )}
      {!isFirst && !decision && <p className="mt-1 text-[11px] text-ink-500">A reviewed build whose record changes goes back to review, and its PIs are told.</p>}
      {choose.error && <p role="alert" className="mt-1 text-xs text-rust-700">{choose.error instanceof ApiError ? choose.error.message : String(choose.error)}</p>}
      {decision && <p role="status" className={`mt-2 text-xs ${decision.kind === 'chosen' ? 'text-moss-700' : 'text-ink-700'}`}>{decision.message}</p>}
    </div>
  );
}

type Column = { title: string; curve: CurveSummary };
const metricOf = (c: CurveSummary, key: string) => c.metrics[key as keyof CurveSummary['metrics']];

/**
 * The metrics of one or two curves side by side (with the change between them): a table on wide
 * screens, one block per metric on a phone; why a metric is missing is listed below either way.
 */
function MetricTable({ keys, columns, difference }: { keys: string[]; columns: Column[]; difference?: boolean }) {
  const [first, second] = columns;
  const change = (key: string) => (second ? formatDifference(key, metricOf(first!.curve, key), metricOf(second.curve, key)) : '—');
  const value = (c: Column, key: string) => (metricOf(c.curve, key) == null ? '—' : formatMetric(key, metricOf(c.curve, key)));
  const notes = keys.flatMap((key) => columns.flatMap((c) => (c.curve.metricNotes[key] ? [{ key: `${key}-${c.title}`, text: `${METRICS[key]?.label ?? key}, ${c.title.toLowerCase()}: ${c.curve.metricNotes[key]}` }] : [])));
  return (
    <div className="mt-2">
      <p className="mb-1 text-[11px] text-ink-500">
        {columns.map((c, i) => <span key={c.title}>{i > 0 && ' · '}{c.title}: <span className="break-all text-ink-700">{c.curve.label || `curve ${c.curve.id}`}</span></span>)}
      </p>
      <table className="hidden text-xs sm:table">
        <thead className="text-left text-ink-500">
          <tr>
            <th scope="col" className="py-1 pr-4 font-medium">Metric</th>
            {columns.map((c) => <th key={c.title} scope="col" className="py-1 pr-4 text-right font-medium">{c.title}</th>)}
            {difference && <th scope="col" className="py-1 text-right font-medium">Change</th>}
          </tr>
        </thead>
        <tbody className="divide-y divide-line">
          {keys.map((key) => (
            <tr key={key}>
              <th scope="row" className="py-1 pr-4 text-left font-normal text-ink-700" title={METRICS[key]?.description}>{METRICS[key]?.label ?? key}</th>
              {columns.map((c) => <td key={c.title} className={`num py-1 pr-4 text-right ${metricOf(c.curve, key) == null ? 'text-ink-300' : 'text-ink-950'}`}>{value(c, key)}</td>)}
              {difference && <td className="num py-1 text-right text-ink-700">{change(key)}</td>}
            </tr>
          ))}
        </tbody>
      </table>
      <dl className="divide-y divide-line text-xs sm:hidden">
        {keys.map((key) => (
          <div key={key} className="py-1">
            <dt className="text-ink-700">{METRICS[key]?.label ?? key}</dt>
            <dd className="grid grid-cols-3 gap-2">
              {columns.map((c) => (
                <span key={c.title} className="min-w-0">
                  <span className="block text-[10px] text-ink-500">{c.title}</span>
                  <span className={`num ${metricOf(c.curve, key) == null ? 'text-ink-300' : 'text-ink-950'}`}>{value(c, key)}</span>
                </span>
              ))}
              {difference && (
                <span className="min-w-0">
                  <span className="block text-[10px] text-ink-500">Change</span>
                  <span className="num text-ink-700">{change(key)}</span>
                </span>
              )}
            </dd>
          </div>
        ))}
      </dl>
      {notes.length > 0 && (
        <div className="mt-1 space-y-0.5 text-[11px] leading-snug text-amber-700" role="note" aria-label="Why some metrics are missing or limited">
          {notes.map((n) => <p key={n.key}>{n.text}</p>)}
        </div>
      )}
    </div>
  );
}
