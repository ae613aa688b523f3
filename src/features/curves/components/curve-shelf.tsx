// A build's curves, one tab per kind: the tab opens on the curve of record; the others are listed
// with their labels and upload dates, can be shown or overlaid on the plot (beginning against end
// of life, a repeat against the first run), and can be made the curve of record.
import { useState, type ReactNode } from 'react';
import type { BuildStatus, CurveSummary } from '@shared/api-types';
import type { CurveKind } from '@shared/curves/types';
import { ApiError } from '@/lib/api-client';
import { Button } from '@/components/ui/button';
import { useConfirm } from '@/components/ui/confirm-dialog';
import { METRICS, formatMetric } from '@/lib/format';
import { useChooseRecord } from '../api/curves';
import { HEADLINE, KIND_LABEL, KIND_WORD, RecordMark, uploadedOn } from './record-parts';

const KINDS: CurveKind[] = ['polarization', 'durability', 'hold', 'impedance'];
const label = (c: CurveSummary) => c.label || `curve ${c.id}`;

export function CurveShelf({ curves, build, projectId, canChoose, renderCurve, empty }: {
  curves: CurveSummary[];
  build: { id: number; code: string; status: BuildStatus };
  projectId: number;
  /** may this person choose the curve of record (the server decides; this only hides the button) */
  canChoose: boolean;
  /** the plot and metrics of the shown curve, with the curves to overlay on it */
  renderCurve: (shown: CurveSummary, overlays: CurveSummary[]) => ReactNode;
  empty: ReactNode;
}) {
  const kinds = KINDS.filter((k) => curves.some((c) => c.kind === k));
  const [kind, setKind] = useState<CurveKind | null>(null);
  const [shownByKind, setShownByKind] = useState<Partial<Record<CurveKind, number>>>({});
  const [overlaid, setOverlaid] = useState<number[]>([]);
  const [said, setSaid] = useState<string | null>(null);
  const choose = useChooseRecord(projectId);
  const [confirm, confirmDialog] = useConfirm();
  if (kinds.length === 0) return <>{empty}</>;

  const activeKind = kind && kinds.includes(kind) ? kind : kinds[0]!;
  const ofKind = curves.filter((c) => c.kind === activeKind);
  const record = ofKind.find((c) => c.isRecord) ?? ofKind[0]!;
  const shown = ofKind.find((c) => c.id === shownByKind[activeKind]) ?? record;
  const overlays = ofKind.filter((c) => c.id !== shown.id && overlaid.includes(c.id));
  const headline = HEADLINE[activeKind];

  const makeRecord = async (c: CurveSummary) => {
    const reviewed = build.status === 'reviewed';
    const ok = await confirm({
      title: `Make “${label(c)}” the ${KIND_WORD[c.kind]} of record?`,
      message: reviewed
        ? `${build.code} is reviewed. Its values change to this curve’s and it goes back to review; its PIs are told.`
        : `Its metrics become the values of ${build.code} everywhere (home, builds table, gains, surface).`,
      confirmLabel: 'Make it the curve of record',
      tone: 'primary',
    });
    if (!ok) return;
    setSaid(null);
    choose.mutate({ buildId: build.id, kind: c.kind, curveId: c.id }, { onSuccess: (answer) => setSaid(answer.record.message) });
  };

  return (
    <div className="min-w-0">
      {confirmDialog}
      {kinds.length > 1 && (
        <div className="mb-3 flex flex-wrap gap-1" role="tablist" aria-label="Kinds of curve">
          {kinds.map((k) => {
            const n = curves.filter((c) => c.kind === k).length;
            return (
              <button
                key={k}
                type="button"
                role="tab"
                id={`curve-tab-${k}`}
                aria-controls="curve-tab-panel"
                aria-selected={k === activeKind}
                onClick={() => setKind(k)}
                className={`rounded-md px-2.5 py-1 text-xs font-medium ${k === activeKind ? 'bg-ink-800 text-white' : 'bg-ink-100 text-ink-700 hover:bg-ink-300/40'}`}
              >
                {KIND_LABEL[k]} · {n}
              </button>
            );
          })}
        </div>
      )}
      <div id="curve-tab-panel" role={kinds.length > 1 ? 'tabpanel' : undefined} aria-labelledby={kinds.length > 1 ? `curve-tab-${activeKind}` : undefined}>
        <ul className="mb-3 divide-y divide-line rounded-md border border-line" aria-label={`${KIND_LABEL[activeKind]} curves of ${build.code}`}>
          {ofKind.map((c) => {
            const isShown = c.id === shown.id;
            return (
              <li key={c.id} className={`flex flex-wrap items-center gap-x-3 gap-y-1.5 px-3 py-2 text-sm ${isShown ? 'bg-paper/60' : ''}`}>
                <div className="min-w-0 flex-1 basis-52">
                  <div className="flex min-w-0 flex-wrap items-center gap-x-2 gap-y-0.5">
                    <span className="min-w-0 break-all font-medium text-ink-900">{label(c)}</span>
                    {c.isRecord && <RecordMark />}
                  </div>
                  <div className="num text-[11px] text-ink-500">
                    {uploadedOn(c)} · {METRICS[headline]?.label} {formatMetric(headline, c.metrics[headline as keyof CurveSummary['metrics']])} · {c.pointCount.toLocaleString('en-GB')} points
                  </div>
                </div>
                <div className="flex flex-wrap items-center gap-2">
                  {ofKind.length > 1 && (
                    <Button aria-pressed={isShown} disabled={isShown} onClick={() => setShownByKind((s) => ({ ...s, [activeKind]: c.id }))} className="px-2 py-1 text-xs" aria-label={isShown ? `${label(c)} is shown` : `Show ${label(c)}`}>
                      {isShown ? 'Shown' : 'Show'}
                    </Button>
                  )}
                  {ofKind.length > 1 && (
                    <label className={`inline-flex items-center gap-1 text-xs ${isShown ? 'text-ink-300' : 'text-ink-700'}`}>
                      <input
                        type="checkbox"
                        disabled={isShown}
                        checked={!isShown && overlaid.includes(c.id)}
                        onChange={(e) => setOverlaid((o) => (e.target.checked ? [...o, c.id] : o.filter((x) => x !== c.id)))}
                        aria-label={`Overlay ${label(c)} on the plot`}
                      />
                      Overlay
                    </label>
                  )}
                  {canChoose && !c.isRecord && (
                    <Button variant="primary" disabled={choose.isPending} onClick={() => makeRecord(c)} className="px-2 py-1 text-xs" aria-label={`Make ${label(c)} the curve of record`}>
                      Make this the curve of record
                    </Button>
                  )}
                </div>
              </li>
            );
          })}
        </ul>
        {said && <p role="status" className="mb-3 text-xs text-moss-700">{said}</p>}
        {choose.error && <p role="alert" className="mb-3 text-xs text-rust-700">{choose.error instanceof ApiError ? choose.error.message : String(choose.error)}</p>}
        {!shown.isRecord && (
          <p className="mb-2 text-xs text-amber-700">Showing “{label(shown)}”, which is not the {KIND_WORD[activeKind]} of record: its metrics are not {build.code}’s values.</p>
        )}
        {renderCurve(shown, overlays)}
      </div>
    </div>
  );
}
