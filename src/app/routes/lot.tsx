// One catalyst lot: its record, the builds made from it (metal loading measured or from the lot's
// metal content), and a comparison of a chosen response with another lot at matched recipes.
import { useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import { useAddLotFile, useLot, useLots, useLotComparison, useRemoveLotFile, useUpdateLot } from '@/features/lots/api/lots';
import { LotForm } from '@/features/lots/components/lot-form';
import { useProject, useResponses } from '@/features/projects/api/projects';
import { can } from '@/features/projects/components/permissions';
import { Button } from '@/components/ui/button';
import { useConfirm } from '@/components/ui/confirm-dialog';
import { PageHeader, Panel, Loading, ErrorNote, EmptyState } from '@/components/ui/panel';
import { Field, Select } from '@/components/ui/field';
import { StatusBadge } from '@/components/ui/status-badge';
import { formatDate, formatNumber, formatSignificant, responseDisplay } from '@/lib/format';
import { ResponseOptions } from '@/components/ui/response-options';
import { formatDifference } from '@/lib/benchmark-difference';
import type { BuildStatus } from '@shared/api-types';

export default function LotPage() {
  const lotId = Number(useParams().lotId);
  const lot = useLot(lotId);
  const projectId = lot.data?.lot.projectId ?? 0;
  const lots = useLots(projectId);
  const [against, setAgainst] = useState<number | null>(null);
  const [response, setResponse] = useState('vAtRef');
  const others = (lots.data ?? []).filter((l) => l.id !== lotId);
  const chosen = against ?? others[0]?.id ?? null;
  const comparison = useLotComparison(lotId, chosen, response);
  const project = useProject(projectId);
  const responses = useResponses(projectId);
  const update = useUpdateLot(lotId);
  const addFile = useAddLotFile(lotId);
  const removeFile = useRemoveLotFile(lotId);
  const [editing, setEditing] = useState(false);
  const [confirm, dialog] = useConfirm();
  if (lot.isLoading) return <Loading />;
  if (lot.error || !lot.data) return <ErrorNote error={lot.error} />;
  const l = lot.data.lot;
  const mayEdit = can(project.data?.myRole ?? null, 'editLots');
  // in the response's display unit, one digit beyond its usual one: means, SDs and intervals of a few builds
  const shown = responseDisplay(comparison.data?.response ?? { key: response, label: '', unit: '' });
  const display = { ...shown, digits: shown.digits + 1 };
  const show = (v: number | null | undefined) => (v == null || !Number.isFinite(v) ? '—' : `${formatNumber(v * display.scale, display.digits)}${display.unit ? ` ${display.unit}` : ''}`);
  const showSigned = (v: number | null | undefined) => formatDifference(display, v ?? null);
  return (
    <div>
      <PageHeader eyebrow={<Link className="hover:underline" to={`/projects/${projectId}/lots`}>Catalyst lots</Link>} title={`Lot ${l.name}`} subtitle={[l.maker, l.madeOn ? `made or received ${formatDate(l.madeOn)}` : null].filter(Boolean).join(' · ')} />
      <Panel title="Record" actions={mayEdit && !editing ? <Button onClick={() => setEditing(true)}>Edit record</Button> : undefined}>
        <dl className="grid grid-cols-2 gap-3 text-sm md:grid-cols-4">
          <div><dt className="text-xs text-ink-500">Maker</dt><dd>{l.maker || '—'}</dd></div>
          <div><dt className="text-xs text-ink-500">Batch size</dt><dd className="num">{l.batchSizeG == null ? '—' : `${formatSignificant(l.batchSizeG, 3)} g`}</dd></div>
          <div><dt className="text-xs text-ink-500">Metal content</dt><dd className="num">{l.metalWtPct == null ? '—' : `${formatNumber(l.metalWtPct, 1)} wt %`}</dd></div>
          <div><dt className="text-xs text-ink-500">Builds made from it</dt><dd className="num">{l.buildCount}</dd></div>
        </dl>
        {l.notes && <p className="mt-3 text-sm text-ink-700">{l.notes}</p>}
        {editing && (
          <div className="mt-4 border-t border-line pt-4">
            <LotForm initial={l} submitLabel="Save record" onSubmit={(v) => update.mutate(v, { onSuccess: () => setEditing(false) })} pending={update.isPending} error={update.error} />
          </div>
        )}
      </Panel>
      <Panel title="Certificates and files" className="mt-4">
        {l.files.length === 0 ? <p className="text-sm text-ink-500">No files kept with this lot yet{mayEdit ? ': add its certificate of analysis, ICP report or the supplier’s data sheet.' : '.'}</p> : (
          <ul className="divide-y divide-line text-sm" aria-label="Files of this lot">
            {l.files.map((f) => (
              <li key={f.id} className="flex items-center justify-between gap-3 py-1.5">
                <span><a className="text-copper-700 underline" href={`/api/files/${f.id}/raw`}>{f.name}</a> <span className="text-xs text-ink-500">{formatSignificant(f.sizeBytes / 1024, 3)} kB · {f.uploadedBy ?? 'someone'} · {formatDate(f.uploadedAt)}</span></span>
                {mayEdit && <Button variant="danger" onClick={async () => { if (await confirm({ title: `Take ${f.name} off the lot?`, message: 'It leaves this list; its stored bytes stay, as every raw file does.', confirmLabel: 'Take it off' })) removeFile.mutate(f.id); }}>Remove</Button>}
              </li>
            ))}
          </ul>
        )}
        {mayEdit && (
          <label className="mt-3 inline-flex cursor-pointer items-center gap-2 text-sm text-copper-700">
            <input type="file" className="sr-only" aria-label="Add a file to this lot" accept=".pdf,.png,.jpg,.jpeg,.tif,.tiff,.csv,.txt,.tsv,.xlsx,.xls,.docx,.odt,.ods" onChange={(e) => { const f = e.target.files?.[0]; if (f) addFile.mutate(f); e.target.value = ''; }} />
            <span className="underline">{addFile.isPending ? 'Adding…' : 'Add a certificate or file'}</span>
            <span className="text-xs text-ink-500">PDF, image or table</span>
          </label>
        )}
        <div className="mt-2"><ErrorNote error={addFile.error ?? removeFile.error} /></div>
      </Panel>
      <Panel title="Builds from this lot" className="mt-4">
        {lot.data.builds.length === 0 ? <EmptyState title="No builds from this lot yet">Pick this lot on a build to see it here and compare lots.</EmptyState> : (
          <table className="w-full text-sm" aria-label="Builds from this lot">
            <thead className="text-left text-xs text-ink-500"><tr><th className="py-1 font-medium">Build</th><th className="font-medium">Status</th><th className="font-medium">Change</th><th className="font-medium">Catalyst loading</th><th className="font-medium">Metal loading</th></tr></thead>
            <tbody className="divide-y divide-line">
              {lot.data.builds.map((b) => (
                <tr key={b.id}>
                  <td className="py-1.5"><Link className="text-copper-700 hover:underline" to={`/projects/${projectId}/builds/${b.id}`}>{b.code}</Link></td>
                  <td><StatusBadge status={b.status as BuildStatus} /></td>
                  <td className="text-ink-700">{b.changeNote ?? '—'}</td>
                  <td className="num">{b.loadingMgCm2 == null ? '—' : `${formatNumber(b.loadingMgCm2, 2)} mg/cm²`}</td>
                  <td className="num">{b.metalLoadingMgCm2 == null ? '—' : `${formatNumber(b.metalLoadingMgCm2, 3)} mg/cm²`} <span className="text-xs text-ink-500">{b.metalLoadingSource ?? ''}</span></td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </Panel>
      <Panel title="Compare with another lot at matched recipes" className="mt-4">
        {others.length === 0 ? <EmptyState title="Only one lot recorded">Record a second lot of this catalyst to judge one batch against the other.</EmptyState> : (
          <>
            <div className="grid gap-3 md:grid-cols-3">
              <Field label="Against lot">{(p) => <Select {...p} value={chosen ?? ''} onChange={(e) => setAgainst(Number(e.target.value))}>{others.map((o) => <option key={o.id} value={o.id}>{o.name}</option>)}</Select>}</Field>
              <Field label="Response">{(p) => (
                <Select {...p} value={response} onChange={(e) => setResponse(e.target.value)}>
                  <ResponseOptions responses={responses.data ?? []} />
                </Select>
              )}</Field>
            </div>
            {comparison.isLoading && <Loading />}
            {comparison.error && <ErrorNote error={comparison.error} />}
            {comparison.data && (
              <div className="mt-3">
                <table className="w-full text-sm" aria-label="Lot comparison">
                  <thead className="text-left text-xs text-ink-500"><tr><th className="py-1 font-medium">Lot</th><th className="font-medium">n</th><th className="font-medium">Mean</th><th className="font-medium">SD</th></tr></thead>
                  <tbody className="divide-y divide-line">
                    <tr><td className="py-1.5">{comparison.data.against.name}</td><td className="num">{comparison.data.a.n}</td><td className="num">{show(comparison.data.a.mean)}</td><td className="num">{show(comparison.data.a.sd)}</td></tr>
                    <tr><td className="py-1.5">{comparison.data.lot.name}</td><td className="num">{comparison.data.b.n}</td><td className="num">{show(comparison.data.b.mean)}</td><td className="num">{show(comparison.data.b.sd)}</td></tr>
                  </tbody>
                </table>
                <p className="mt-2 text-sm text-ink-900">
                  {comparison.data.welch
                    ? <>Difference {comparison.data.lot.name} − {comparison.data.against.name}: <span className="num">{showSigned(comparison.data.welch.diff)}</span>, 95 % Welch interval <span className="num">{showSigned(comparison.data.welch.low)} to {showSigned(comparison.data.welch.high)}</span> (ν = {formatNumber(comparison.data.welch.df, 1)}){comparison.data.welch.low > 0 || comparison.data.welch.high < 0 ? ' — beyond build-to-build noise.' : ' — within build-to-build noise.'}</>
                    : comparison.data.matchedRecipes.length === 0
                      ? 'No recipe was made from both lots yet: build the same recipe from each lot to compare them.'
                      : 'An interval needs at least two builds of the matched recipes from each lot: add a replicate.'}
                </p>
                <p className="mt-1 text-xs text-ink-500">{comparison.data.matchedRecipes.length} matched recipe(s); {comparison.data.unmatched} build(s) with a recipe made from one lot only are left out.</p>
              </div>
            )}
          </>
        )}
      </Panel>
      {dialog}
    </div>
  );
}
