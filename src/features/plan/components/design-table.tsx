// A generated design: what it is (structure, generators, resolution, aliases, α) in plain words,
// its warnings, and the builds it asks for in build order — in the factors' own units or scaled
// −1…+1 — with a CSV for the lab.
import { useState } from 'react';
import type { FactorDef } from '@shared/api-types';
import type { Design, PointType } from '@shared/doe/designs/types';
import { designToCsv } from '@shared/doe/designs/index';
import { Button } from '@/components/ui/button';
import { KIND_LABELS, VARIANT_HELP } from './design-form';

function download(text: string, name: string) {
  const url = URL.createObjectURL(new Blob([text], { type: 'text/csv;charset=utf-8' }));
  const a = document.createElement('a');
  a.href = url;
  a.download = name;
  a.click();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}

/** Each kind of design point in our words. */
export const POINT_WORDS: Record<PointType, { one: string; many: string }> = {
  factorial: { one: 'corner', many: 'corners' },
  axial: { one: 'axial', many: 'axial builds' },
  centre: { one: 'centre point', many: 'centre points' },
  edge: { one: 'edge midpoint', many: 'edge midpoints' },
  lhs: { one: 'space-filling', many: 'space-filling builds' },
  level: { one: 'level grid', many: 'level-grid builds' },
};

const ROMAN = ['', 'I', 'II', 'III', 'IV', 'V', 'VI', 'VII', 'VIII'];

export function DesignSummary({ design, factors }: { design: Design; factors: FactorDef[] }) {
  const info = design.info;
  const byKey = new Map(factors.map((f) => [f.key, f]));
  const parts = Object.entries(info.runsByType).map(([t, n]) => `${n} ${n === 1 ? POINT_WORDS[t as PointType]?.one ?? t : POINT_WORDS[t as PointType]?.many ?? t}`);
  return (
    <div className="flex flex-col gap-2 text-sm">
      <p>
        <strong>{KIND_LABELS[design.kind]}</strong>{info.variant ? ` (${info.variant})` : ''}: <span className="num">{info.totalRuns}</span> builds ({parts.join(', ')}),
        {' '}{info.blocks === 1 ? 'one block' : `${info.blocks} blocks`}, seed <span className="num">{info.seed}</span>{info.randomized ? ', built in random order' : ', built in standard order'}.
      </p>
      {info.variant && <p className="text-ink-500">{VARIANT_HELP[info.variant]}</p>}
      {info.generators && info.generators.length > 0 && (
        <p className="text-ink-500">
          Factor letters: {Object.entries(info.factorLetters).map(([letter, key]) => `${letter} = ${byKey.get(key)?.label ?? key}`).join(', ')}.
        </p>
      )}
      {info.levelCombinations > 1 && <p className="text-ink-500">Repeated at each of {info.levelCombinations} combinations of the categorical levels.</p>}
      {info.generators && info.generators.length > 0 && (
        <p>Generators <span className="num">{info.generators.join(', ')}</span>; defining relation <span className="num">{info.definingRelation}</span>{info.resolution ? <>; resolution <strong>{ROMAN[info.resolution] ?? info.resolution}</strong></> : null}.</p>
      )}
      {info.aliasChains && info.aliasChains.length > 0 && (
        <details>
          <summary className="cursor-pointer text-copper-700">Which effects cannot be told apart ({info.aliasChains.length} groups)</summary>
          <ul className="num mt-1 columns-2 text-xs">
            {info.aliasChains.map((c) => <li key={c.effect}>{c.effect} = {c.aliases.join(' = ')}</li>)}
          </ul>
        </details>
      )}
      {info.alpha != null && <p>Axial distance α = <span className="num">{info.alpha.toFixed(3)}</span> half-ranges{info.alphaRule ? `, ${info.alphaRule}` : ''}.</p>}
      {info.minPairwiseDistance != null && <p>Closest two builds are <span className="num">{info.minPairwiseDistance.toFixed(3)}</span> half-ranges apart.</p>}
      {info.blocking && info.blocks > 1 && <p className="text-ink-500">{info.blocking}</p>}
      {design.warnings.map((w) => (
        <p key={w} role="note" className="rounded-md border border-amber-700/30 bg-amber-100 px-3 py-1.5 text-amber-700">▲ {w}</p>
      ))}
    </div>
  );
}

export function DesignTable({ design, factors, fileName }: { design: Design; factors: FactorDef[]; fileName: string }) {
  const [coded, setCoded] = useState(false);
  const byKey = new Map(factors.map((f) => [f.key, f]));
  const blocks = design.info.blocks > 1;
  const outOfRange = (key: string, value: number | string) => {
    const f = byKey.get(key);
    return typeof value === 'number' && f?.low != null && f?.high != null && (value < f.low - 1e-9 || value > f.high + 1e-9);
  };
  return (
    <div>
      <div className="mb-2 flex flex-wrap items-center gap-3 text-sm">
        <div role="radiogroup" aria-label="Units" className="inline-flex overflow-hidden rounded-md border border-line">
          <button type="button" role="radio" aria-checked={!coded} onClick={() => setCoded(false)} className={`px-3 py-1 ${!coded ? 'bg-ink-800 text-white' : 'bg-white'}`}>Factor units</button>
          <button type="button" role="radio" aria-checked={coded} onClick={() => setCoded(true)} className={`px-3 py-1 ${coded ? 'bg-ink-800 text-white' : 'bg-white'}`}>Scaled (−1…+1)</button>
        </div>
        <Button className="ml-auto" onClick={() => download(designToCsv(design, { coded, labels: Object.fromEntries(factors.map((f) => [f.key, coded || !f.unit ? f.label : `${f.label} (${f.unit})`])), pointWords: Object.fromEntries(Object.entries(POINT_WORDS).map(([k, v]) => [k, v.one])) }), `${fileName}${coded ? '-scaled' : ''}.csv`)}>Download CSV</Button>
      </div>
      <div className="max-h-[28rem] overflow-auto rounded-md border border-line" tabIndex={0} role="region" aria-label="Design builds, scrollable">
        <table className="w-full text-sm" aria-label="Design runs">
          <thead className="sticky top-0 bg-ink-100 text-left text-xs text-ink-700">
            <tr>
              <th className="px-2 py-1.5" title="the order to make them in">Build</th>
              {design.factorKeys.map((k) => {
                const f = byKey.get(k);
                return <th key={k} className="px-2 py-1.5">{f?.label ?? k}{!coded && f?.unit ? <span className="font-normal text-ink-500"> ({f.unit})</span> : null}</th>;
              })}
              <th className="px-2 py-1.5">Role in the design</th>
              {blocks && <th className="px-2 py-1.5">Block</th>}
            </tr>
          </thead>
          <tbody>
            {design.runs.map((run) => (
              <tr key={run.runOrder} className="border-t border-line">
                <td className="num px-2 py-1">{run.runOrder}</td>
                {design.factorKeys.map((k) => {
                  const value = coded ? run.coded[k]! : run.actual[k]!;
                  const outside = !coded && outOfRange(k, value);
                  return (
                    <td key={k} className={`px-2 py-1 ${typeof value === 'number' ? 'num' : ''} ${outside ? 'text-rust-700' : ''}`} title={outside ? 'outside the factor range set in the project' : undefined}>
                      {typeof value === 'number' ? Number(value.toPrecision(coded ? 4 : 5)) : value}{outside ? ' ▲' : ''}
                    </td>
                  );
                })}
                <td className="px-2 py-1 text-ink-500">{POINT_WORDS[run.pointType]?.one ?? run.pointType}</td>
                {blocks && <td className="num px-2 py-1">{run.block}</td>}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}
