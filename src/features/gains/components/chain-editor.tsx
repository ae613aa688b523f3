// The chain of builds a waterfall walks: shown in order, each removable or movable, with a
// picker to append any build of the project and a way back to the lineage's best path.
import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { Field, Select } from '@/components/ui/field';

export interface ChainBuild {
  id: number;
  code: string;
  changeNote: string | null;
  status: string;
}

export function ChainEditor({ chain, builds, onChange, onReset, fromBestPath }: { chain: number[]; builds: ChainBuild[]; onChange: (ids: number[]) => void; onReset: () => void; fromBestPath: boolean }) {
  const [adding, setAdding] = useState('');
  const byId = new Map(builds.map((b) => [b.id, b]));
  const available = builds.filter((b) => !chain.includes(b.id) && b.status !== 'planned' && b.status !== 'discarded');
  const move = (k: number, by: number) => {
    const next = [...chain];
    const [item] = next.splice(k, 1);
    next.splice(k + by, 0, item);
    onChange(next);
  };
  return (
    <div className="space-y-3">
      <p className="text-xs text-ink-500">{fromBestPath ? 'Showing the best path of the lineage, from its baseline to the best build. Change it to tell another story.' : 'A hand-picked chain. The link of this page keeps it.'}</p>
      <ol className="space-y-1" aria-label="Chain of builds">
        {chain.map((id, k) => {
          const b = byId.get(id);
          return (
            <li key={id} className="flex items-center gap-2 rounded-md border border-line bg-white px-2 py-1 text-sm">
              <span className="num w-5 text-xs text-ink-500">{k === 0 ? 'B' : k}</span>
              <span className="font-medium text-ink-900">{b?.code ?? `#${id}`}</span>
              <span className="min-w-0 flex-1 truncate text-xs text-ink-500" title={b?.changeNote ?? ''}>{k === 0 ? 'baseline' : b?.changeNote}</span>
              <button type="button" className="rounded px-1 text-ink-500 hover:bg-ink-100 disabled:opacity-30" aria-label={`Move ${b?.code} earlier`} disabled={k === 0} onClick={() => move(k, -1)}>↑</button>
              <button type="button" className="rounded px-1 text-ink-500 hover:bg-ink-100 disabled:opacity-30" aria-label={`Move ${b?.code} later`} disabled={k === chain.length - 1} onClick={() => move(k, 1)}>↓</button>
              <button type="button" className="rounded px-1 text-rust-700 hover:bg-rust-100 disabled:opacity-30" aria-label={`Remove ${b?.code} from the chain`} disabled={chain.length <= 1} onClick={() => onChange(chain.filter((x) => x !== id))}>×</button>
            </li>
          );
        })}
      </ol>
      <div className="flex items-end gap-2">
        <div className="flex-1">
          <Field label="Add a build to the end">
            {(props) => (
              <Select {...props} value={adding} onChange={(e) => setAdding(e.target.value)}>
                <option value="">Choose a build…</option>
                {available.map((b) => <option key={b.id} value={b.id}>{b.code}{b.changeNote ? ` — ${b.changeNote}` : ''}</option>)}
              </Select>
            )}
          </Field>
        </div>
        <Button disabled={!adding} onClick={() => { onChange([...chain, Number(adding)]); setAdding(''); }}>Add</Button>
      </div>
      {!fromBestPath && <Button variant="ghost" onClick={onReset}>Back to the best path</Button>}
    </div>
  );
}
