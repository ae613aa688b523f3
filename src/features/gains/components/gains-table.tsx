// The waterfall as a table (every step with its value, n, SD, gain, interval, verdict and method)
// and its CSV export in display units.
import { Link } from 'react-router-dom';
import { Button } from '@/components/ui/button';
import { downloadText } from '@/components/plot/export';
import { formatNumber } from '@/lib/format';
import { writeCsv } from '@shared/csv/write-csv';
import type { GainsData } from '../api/get-gains';
import { displayOf, showGain, showValue } from './display';

function NoiseMark({ withinNoise }: { withinNoise: boolean | null }) {
  if (withinNoise === null) return <span className="text-ink-500">no interval</span>;
  return withinNoise ? (
    <span className="inline-flex items-center gap-1 whitespace-nowrap rounded-full bg-ink-100 px-2 py-0.5 text-xs text-ink-700">
      <svg aria-hidden width="10" height="10" viewBox="0 0 10 10"><path d="M1 5h8" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" /></svg>within noise
    </span>
  ) : (
    <span className="inline-flex items-center gap-1 whitespace-nowrap rounded-full bg-moss-100 px-2 py-0.5 text-xs text-moss-700">
      <svg aria-hidden width="10" height="10" viewBox="0 0 10 10"><path d="M1.5 5.2 4 7.8 8.8 2.2" fill="none" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" /></svg>beyond noise
    </span>
  );
}

export function gainsCsv(data: GainsData): string {
  const d = displayOf(data.response);
  const u = d.unit;
  const num = (v: number | null) => (v == null ? '' : Number((v * d.scale).toPrecision(8)));
  const header = ['step', 'build', 'replicates', 'change note', 'recipe change', `value (${u})`, `SD (${u})`, 'n', `gain (${u})`, `low 95 % (${u})`, `high 95 % (${u})`, 'within noise', 'method'];
  const rows = data.steps.map((st, k) => [k === 0 ? 'baseline' : String(k), st.code, st.replicates.join(' '), st.changeNote ?? '', st.changeText ?? '', num(st.value), num(st.sd), st.n, num(st.gain), num(st.low), num(st.high), st.withinNoise == null ? '' : st.withinNoise ? 'yes' : 'no', st.note ?? '']);
  rows.push(['total', `${data.steps[0].code} → ${data.steps[data.steps.length - 1].code}`, '', '', '', num(data.total.value), '', '', num(data.total.gain), num(data.total.low), num(data.total.high), data.total.withinNoise == null ? '' : data.total.withinNoise ? 'yes' : 'no', data.total.note ?? '']);
  return writeCsv([header, ...rows]);
}

/** The method note in display units (the server's note carries internal units). */
function methodText(data: GainsData, method: string, note: string | null): string {
  const d = displayOf(data.response);
  if (method === 'pooled' && data.pooledSd && note?.startsWith('no replicates: pooled')) return `no replicates on one side: pooled replicate SD ${formatNumber(data.pooledSd.sd * d.scale, d.gainDigits)} ${d.unit} (df ${data.pooledSd.df}) used`;
  return note ?? '';
}

/** `benchmark`: show each step's value as its difference from the benchmark's value too. */
export function GainsTable({ data, projectId, fileName, benchmark }: { data: GainsData; projectId: number; fileName: string; benchmark?: { label: string; value: number } | null }) {
  const d = displayOf(data.response);
  return (
    <div>
      <div className="overflow-x-auto">
        <table className="w-full text-sm" aria-label="Gains steps">
          <thead className="text-left text-xs text-ink-500">
            <tr>
              <th className="py-1 pr-3 font-medium">Step</th>
              <th className="pr-3 font-medium">Change</th>
              <th className="pr-3 text-right font-medium">Value ({d.unit})</th>
              {benchmark && <th className="pr-3 text-right font-medium">vs benchmark {benchmark.label}</th>}
              <th className="pr-3 text-right font-medium">Gain</th>
              <th className="pr-3 text-right font-medium">95 % interval</th>
              <th className="pr-3 font-medium">Noise</th>
              <th className="font-medium">Method</th>
            </tr>
          </thead>
          <tbody className="divide-y divide-line">
            {data.steps.map((st, k) => (
              <tr key={`${st.buildId}-${k}`} className="align-top">
                <td className="py-1.5 pr-3">
                  <Link className="font-medium text-copper-700 hover:underline" to={`/projects/${projectId}/builds/${st.buildId}`}>{st.code}</Link>
                  {st.replicates.length > 1 && <div className="text-[11px] text-ink-500">with {st.replicates.filter((c) => c !== st.code).join(', ')}</div>}
                </td>
                <td className="pr-3">
                  {k === 0 ? <span className="text-ink-500">baseline</span> : (
                    <>
                      <div className="text-ink-900">{st.changeNote ?? '—'}</div>
                      {st.changeText && <div className="text-[11px] text-ink-500">recipe: {st.changeText}</div>}
                    </>
                  )}
                </td>
                <td className="num whitespace-nowrap pr-3 text-right">
                  {showValue(d, st.value)}
                  <div className="whitespace-nowrap text-[11px] text-ink-500">{st.sd != null ? `SD ${formatNumber(st.sd * d.scale, d.gainDigits)}, ` : ''}n = {st.n}</div>
                </td>
                {benchmark && <td className="num whitespace-nowrap pr-3 text-right">{showGain(d, st.value - benchmark.value)}</td>}
                <td className={`num whitespace-nowrap pr-3 text-right font-medium ${st.gain == null ? '' : st.gain >= 0 ? 'text-moss-700' : 'text-rust-700'}`}>{k === 0 ? '—' : showGain(d, st.gain)}</td>
                <td className="num whitespace-nowrap pr-3 text-right text-ink-700">{st.low == null || st.high == null ? '—' : `${showGain(d, st.low)} … ${showGain(d, st.high)}`}</td>
                <td className="pr-3">{k === 0 ? '' : <NoiseMark withinNoise={st.withinNoise} />}</td>
                <td className="text-xs text-ink-500">{k === 0 ? '' : methodText(data, st.method, st.note)}</td>
              </tr>
            ))}
            <tr className="border-t-2 border-ink-300 align-top font-medium">
              <td className="py-1.5 pr-3">Total</td>
              <td className="pr-3 text-ink-700">{data.steps[0].code} → {data.steps[data.steps.length - 1].code}</td>
              <td className="num pr-3 text-right">{showValue(d, data.total.value)}</td>
              {benchmark && <td className="num whitespace-nowrap pr-3 text-right">{showGain(d, data.total.value - benchmark.value)}</td>}
              <td className={`num whitespace-nowrap pr-3 text-right ${data.total.gain >= 0 ? 'text-moss-700' : 'text-rust-700'}`}>{showGain(d, data.total.gain)}</td>
              <td className="num whitespace-nowrap pr-3 text-right text-ink-700">{data.total.low == null || data.total.high == null ? '—' : `${showGain(d, data.total.low)} … ${showGain(d, data.total.high)}`}</td>
              <td className="pr-3">{data.steps.length > 1 && <NoiseMark withinNoise={data.total.withinNoise} />}</td>
              <td className="text-xs font-normal text-ink-500">{methodText(data, data.total.method, data.total.note)}</td>
            </tr>
          </tbody>
        </table>
      </div>
      <div className="mt-3 flex items-center justify-between gap-3 text-xs text-ink-500">
        <span>
          Each step's gain = its replicate-group mean − the previous step's. Intervals: Welch where both steps have replicates, else the project's pooled replicate SD
          {data.pooledSd ? ` (${formatNumber(data.pooledSd.sd * d.scale, d.gainDigits)} ${d.unit}, df ${data.pooledSd.df}, from ${data.pooledSd.groups} replicate groups)` : ' (none: no build has replicates for this response)'}.
        </span>
        <Button onClick={() => downloadText(gainsCsv(data), `${fileName}.csv`)}>Export CSV</Button>
      </div>
    </div>
  );
}
