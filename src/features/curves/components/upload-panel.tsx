// Upload one or more files to a build: progress per file, a column preview to confirm when the
// file's columns or units are ambiguous, optional saving of the mapping as an import profile.
import { useCallback, useId, useState } from 'react';
import { useForm } from 'react-hook-form';
import type { ProjectSettings, UploadPreview } from '@shared/api-types';
import type { ColumnMapping, CurveKind } from '@shared/curves/types';
import { ApiError } from '@/lib/api-client';
import { fetchUploadProgress, newUploadId, uploadCurve, useInvalidateAfterUpload, useProfiles, type UploadProgress } from '../api/curves';
import { Button } from '@/components/ui/button';
import { Input, Select } from '@/components/ui/field';
import { UploadResult, type StoredUpload } from './upload-result';
import { hasEnoughColumns, initialMappingValues, mappingResolver, needsArea, quantitiesFor, type MappingChoice, type MappingFormValues } from './mapping-values';

export interface UploadRow {
  key: string;
  file: File;
  buildId: number | null;
  state: 'waiting' | 'uploading' | 'processing' | 'done' | 'error' | 'confirm';
  progress: number;
  /** server-side phase once the bytes are sent */
  processing?: Pick<UploadProgress, 'phase' | 'fraction'>;
  message?: string;
  preview?: UploadPreview;
  curveId?: number;
  kind?: CurveKind;
  /** the stored curve and the build's record of its kind, once stored */
  stored?: StoredUpload;
}

const UNIT_LABEL: Record<string, string> = { 'A/cm2': 'A/cm²', 'mA/cm2': 'mA/cm²', A: 'A (total)', mA: 'mA (total)', V: 'V', mV: 'mV', 'ohm*cm2': 'Ω·cm²', 'mohm*cm2': 'mΩ·cm²', ohm: 'Ω (total)', mohm: 'mΩ (total)', s: 's', min: 'min', h: 'h', timestamp: 'date/time', C: '°C', K: 'K', Hz: 'Hz', kHz: 'kHz', MHz: 'MHz', 'rad/s': 'rad/s', deg: 'degrees', rad: 'radians' };

function InlineError({ id, message }: { id: string; message?: string }) {
  return message ? <p id={id} role="alert" className="text-xs text-rust-700">{message}</p> : null;
}

/** The columns of a file the reader was not sure of, to confirm or correct; checked by the upload schemas (mapping-values.ts). */
export function MappingConfirm({ preview, onConfirm, onCancel }: { preview: UploadPreview; onConfirm: (m: ColumnMapping, opts: { kind: CurveKind; saveProfileAs?: string; areaCm2?: number; sheet?: string }) => void; onCancel: () => void }) {
  const [defaults] = useState(() => initialMappingValues(preview));
  const { register, handleSubmit, watch, formState } = useForm<MappingFormValues>({ defaultValues: defaults, resolver: mappingResolver });
  const e = formState.errors;
  const ids = useId();
  const values = watch();
  const fileArea = preview.conditions?.areaCm2 ?? null;
  const buildArea = preview.buildAreaCm2 ?? null;
  const area = values.area ?? '';
  const areaSource = area === '' ? null : fileArea != null && Number(area) === fileArea ? 'from the file' : buildArea != null && Number(area) === buildArea ? 'the build’s recorded area' : 'entered here';
  const hasVoltage = hasEnoughColumns(values);
  const submit = handleSubmit((checked) => {
    const { mapping, ...opts } = checked as unknown as MappingChoice;
    onConfirm(mapping, opts);
  });
  return (
    <form noValidate onSubmit={submit} aria-label={`Columns of ${preview.fileName ?? 'this file'}`} className="mt-2 rounded-md border border-copper-500/40 bg-copper-100/40 p-3">
      <p className="text-sm font-medium text-ink-900">Confirm the columns of {preview.fileName ?? 'this file'}</p>
      {preview.reasons.length > 0 && <ul className="mt-1 list-disc pl-5 text-xs text-amber-800" aria-label="What needs confirming">{preview.reasons.map((r) => <li key={r} className="break-words">{r}</li>)}</ul>}
      <div className="mt-2 overflow-x-auto">
        <table className="text-xs">
          <thead><tr>{preview.header.map((h, i) => <th key={i} className="border-b border-line px-2 py-1 text-left font-semibold">{h}</th>)}</tr></thead>
          <tbody>{preview.rows.slice(0, 6).map((r, i) => <tr key={i}>{r.map((c, k) => <td key={k} className="num px-2 py-0.5 text-ink-700">{c}</td>)}</tr>)}</tbody>
        </table>
        <p className="mt-1 text-[11px] text-ink-500">{preview.rowCount.toLocaleString()} data rows; header on line {preview.headerLine}; delimiter “{preview.delimiter === '\t' ? 'tab' : preview.delimiter}”{preview.decimalComma ? ', decimal comma' : ''}</p>
      </div>
      <div className="mt-3 grid gap-2 sm:grid-cols-2 lg:grid-cols-3">
        <label className="text-xs text-ink-700">Curve kind
          <Select {...register('kind')} aria-label="Curve kind">
            <option value="polarization">polarization</option><option value="durability">durability</option><option value="hold">hold (open circuit)</option><option value="impedance">impedance spectrum</option>
          </Select>
        </label>
        {preview.sheets && preview.sheets.length > 1 && (
          <label className="text-xs text-ink-700">Sheet
            <Select {...register('sheet')} aria-label="Sheet">{preview.sheets.map((s) => <option key={s}>{s}</option>)}</Select>
          </label>
        )}
        {quantitiesFor(values.kind).map((q) => {
          const error = e.columns?.[q.key]?.message ?? e.units?.[q.key]?.message;
          const errorId = `${ids}-${q.key}-error`;
          return (
            <div key={q.key} className="flex flex-col gap-1">
              <div className="flex items-end gap-1">
                <label className="flex-1 text-xs text-ink-700">{q.label} column
                  <Select aria-label={`${q.label} column`} aria-invalid={Boolean(e.columns?.[q.key])} aria-describedby={error ? errorId : undefined} {...register(`columns.${q.key}`)}>
                    <option value="">— none —</option>
                    {preview.header.map((h, i) => <option key={i} value={i}>{h}</option>)}
                  </Select>
                </label>
                <label className="w-28 text-xs text-ink-700">unit
                  <Select aria-label={`${q.label} unit`} aria-invalid={Boolean(e.units?.[q.key])} disabled={values.columns?.[q.key] === ''} {...register(`units.${q.key}`)}>
                    {q.units.map((u) => <option key={u} value={u}>{UNIT_LABEL[u]}</option>)}
                  </Select>
                </label>
              </div>
              <InlineError id={errorId} message={error} />
            </div>
          );
        })}
        {values.kind !== 'impedance' && values.columns?.current !== '' && (
          <label className="flex items-center gap-2 self-end text-xs text-ink-700">
            <input type="checkbox" {...register('negated')} />
            The file logs load current as negative (multiply by −1)
          </label>
        )}
        {needsArea(values) && (
          <div className="flex flex-col gap-1">
            <label className="text-xs text-ink-700">Active area (cm²) — needed for total current or Ω{areaSource && <span className="text-ink-500">, {areaSource}</span>}
              <Input type="number" step="any" min="0" aria-label="Active area" aria-invalid={Boolean(e.area)} aria-describedby={e.area ? `${ids}-area-error` : undefined} {...register('area')} />
            </label>
            <InlineError id={`${ids}-area-error`} message={e.area?.message} />
          </div>
        )}
        <div className="flex flex-col gap-1">
          <label className="text-xs text-ink-700">Save as import profile (optional)
            <Input placeholder="e.g. partner station export" aria-label="Profile name" aria-invalid={Boolean(e.profileName)} aria-describedby={e.profileName ? `${ids}-profile-error` : undefined} {...register('profileName')} />
          </label>
          <InlineError id={`${ids}-profile-error`} message={e.profileName?.message} />
        </div>
      </div>
      <InlineError id={`${ids}-error`} message={e.root?.message} />
      <div className="mt-3 flex gap-2">
        <Button type="submit" variant="primary" disabled={!hasVoltage}>Use these columns</Button>
        <Button onClick={onCancel}>Skip this file</Button>
      </div>
    </form>
  );
}

/** Drives a batch of uploads: each file on its own, one result row per file. */
export function useUploadBatch(projectId: number) {
  const [rows, setRows] = useState<UploadRow[]>([]);
  const invalidate = useInvalidateAfterUpload(projectId);
  const patch = (key: string, change: Partial<UploadRow>) => setRows((rs) => rs.map((r) => (r.key === key ? { ...r, ...change } : r)));

  const send = useCallback(async (row: UploadRow, fields: Parameters<typeof uploadCurve>[2]) => {
    if (!row.buildId) return patch(row.key, { state: 'error', message: 'Choose the build this file belongs to.' });
    patch(row.key, { state: 'uploading', progress: 0, message: undefined, processing: undefined });
    const uploadId = newUploadId();
    let polling = false;
    let finished = false;
    // once the bytes are sent, ask the server how far parsing / measuring / storing has got
    const poll = async () => {
      while (!finished) {
        try {
          const p = await fetchUploadProgress(uploadId);
          if (!finished) patch(row.key, { state: 'processing', processing: { phase: p.phase, fraction: p.fraction } });
        } catch { /* a missed poll is not an error; the upload's own answer decides */ }
        await new Promise((r) => setTimeout(r, 400));
      }
    };
    try {
      const result = await uploadCurve(row.buildId, row.file, { ...fields, uploadId }, (f) => {
        patch(row.key, { progress: f });
        if (f >= 1 && !polling && row.file.size > 256 * 1024) { polling = true; void poll(); }
      }).finally(() => { finished = true; });
      const notesText = [result.curve.summary.sheet ? `Read from sheet “${String(result.curve.summary.sheet)}”.` : null, result.curve.summary.profileNote ? `${String(result.curve.summary.profileNote)}.` : null].filter(Boolean).join(' ');
      patch(row.key, { state: 'done', progress: 1, curveId: result.curve.id, kind: result.curve.kind, stored: { curve: result.curve, recordCurve: result.recordCurve ?? null }, message: notesText || undefined });
      invalidate(row.buildId);
    } catch (error) {
      if (error instanceof ApiError && error.code === 'mapping-needed') {
        const d = error.details as UploadPreview & { preview: UploadPreview; profileMismatch?: string };
        patch(row.key, { state: 'confirm', preview: { ...d.preview, detected: d.detected, reasons: d.profileMismatch ? [...d.reasons, d.profileMismatch] : d.reasons, kind: d.kind, sheets: d.sheets, sheet: d.sheet, fileName: row.file.name }, message: error.message });
      } else {
        patch(row.key, { state: 'error', message: error instanceof Error ? error.message : String(error) });
      }
    }
  }, [invalidate]);

  return { rows, setRows, patch, send };
}

const PHASE_LABEL: Record<UploadProgress['phase'], string> = { receiving: 'server receiving…', parsing: 'parsing', measuring: 'measuring…', storing: 'storing…', done: 'finishing…', error: 'refused' };

export function UploadRows({ rows, onConfirm, onSkip, buildChoices, onChooseBuild, projectId, settings, buildCodeOf }: {
  rows: UploadRow[];
  projectId: number;
  /** the project's reference point, printed with the stored curve's metrics */
  settings: ProjectSettings | null;
  /** the build code shown in each stored file's result */
  buildCodeOf: (buildId: number) => string;
  onConfirm: (row: UploadRow, mapping: ColumnMapping, opts: { kind: CurveKind; saveProfileAs?: string; areaCm2?: number; sheet?: string }) => void;
  onSkip: (row: UploadRow) => void;
  buildChoices?: { id: number; code: string }[];
  onChooseBuild?: (row: UploadRow, buildId: number) => void;
}) {
  if (rows.length === 0) return null;
  return (
    <ul className="mt-3 divide-y divide-line rounded-md border border-line bg-white" aria-label="Upload results">
      {rows.map((row) => (
        <li key={row.key} className="px-3 py-2 text-sm">
          <div className="flex flex-wrap items-center gap-x-3 gap-y-1">
            <span className="min-w-0 flex-1 basis-40 truncate font-medium text-ink-900">{row.file.name}</span>
            {buildChoices && onChooseBuild && (
              <Select aria-label={`Build for ${row.file.name}`} className="w-36 shrink-0" value={row.buildId ?? ''} onChange={(e) => onChooseBuild(row, Number(e.target.value))} disabled={row.state === 'uploading' || row.state === 'processing' || row.state === 'done'}>
                <option value="">— build —</option>
                {buildChoices.map((b) => <option key={b.id} value={b.id}>{b.code}</option>)}
              </Select>
            )}
            <span className="w-40 max-w-full">
              {row.state === 'uploading' && (
                <span className="block h-2 overflow-hidden rounded bg-ink-100" role="progressbar" aria-valuenow={Math.round(row.progress * 100)} aria-valuemin={0} aria-valuemax={100} aria-label={`Uploading ${row.file.name}`}>
                  <span className="block h-full bg-copper-500 transition-all" style={{ width: `${Math.max(4, row.progress * 100)}%` }} />
                </span>
              )}
              {row.state === 'processing' && (
                <span className="block">
                  <span className="block h-2 overflow-hidden rounded bg-ink-100" role="progressbar" aria-valuenow={row.processing?.fraction == null ? undefined : Math.round(row.processing.fraction * 100)} aria-valuemin={0} aria-valuemax={100} aria-label={`Processing ${row.file.name}`}>
                    <span className={`block h-full bg-ink-500 transition-all ${row.processing?.fraction == null ? 'animate-pulse' : ''}`} style={{ width: `${row.processing?.fraction == null ? 100 : Math.max(4, row.processing.fraction * 100)}%` }} />
                  </span>
                  <span className="text-[11px] text-ink-500">{PHASE_LABEL[row.processing?.phase ?? 'receiving']}{row.processing?.phase === 'parsing' && row.processing.fraction != null ? ` ${Math.round(row.processing.fraction * 100)} %` : ''}</span>
                </span>
              )}
              {row.state === 'done' && <span className="text-moss-700">✓ stored</span>}
              {row.state === 'error' && <span className="text-rust-700">✕ refused</span>}
              {row.state === 'confirm' && <span className="text-amber-700">? confirm columns</span>}
              {row.state === 'waiting' && <span className="text-ink-500">waiting</span>}
            </span>
          </div>
          {row.message && row.state !== 'confirm' && <p className={`mt-0.5 text-xs ${row.state === 'error' ? 'text-rust-700' : 'text-ink-500'}`}>{row.message}</p>}
          {row.state === 'done' && row.stored && row.buildId != null && (
            <UploadResult stored={row.stored} projectId={projectId} buildCode={buildCodeOf(row.buildId)} settings={settings} />
          )}
          {row.state === 'confirm' && row.preview && (
            <MappingConfirm preview={row.preview} onConfirm={(m, o) => onConfirm(row, m, o)} onCancel={() => onSkip(row)} />
          )}
        </li>
      ))}
    </ul>
  );
}

export function DropZone({ onFiles, label = 'Drop curve files here (CSV, TSV, TXT, XLSX) or choose them' }: { onFiles: (files: File[]) => void; label?: string }) {
  const [over, setOver] = useState(false);
  return (
    <label
      onDragOver={(e) => { e.preventDefault(); setOver(true); }}
      onDragLeave={() => setOver(false)}
      onDrop={(e) => { e.preventDefault(); setOver(false); onFiles([...e.dataTransfer.files]); }}
      className={`flex cursor-pointer flex-col items-center justify-center gap-1 rounded-md border-2 border-dashed px-4 py-6 text-center text-sm transition-colors focus-within:outline-2 focus-within:outline-offset-2 focus-within:outline-copper-500 ${over ? 'border-copper-500 bg-copper-100/50' : 'border-line bg-paper/40 hover:border-ink-300'}`}
    >
      <span className="font-medium text-ink-800">{label}</span>
      <span className="text-xs text-ink-500">Columns and units are detected; you confirm them when they are ambiguous.</span>
      <input type="file" multiple className="sr-only" aria-label="Choose curve files" accept=".csv,.tsv,.txt,.dat,.xlsx,text/plain,text/csv" onChange={(e) => { onFiles([...(e.target.files ?? [])]); e.target.value = ''; }} />
    </label>
  );
}

export function useProfilesFor(projectId: number) {
  return useProfiles(projectId);
}
