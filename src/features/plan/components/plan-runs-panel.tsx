// Turns a generated design into planned builds in one step: optional parent, a lab per block,
// loading and area for every build, and a note that ends up in each change note.
import { useState } from 'react';
import { Link } from 'react-router-dom';
import type { Build, Lab } from '@shared/api-types';
import type { Design } from '@shared/doe/designs/types';
import { Field, Input, Select } from '@/components/ui/field';
import { Button } from '@/components/ui/button';
import { ErrorNote } from '@/components/ui/panel';
import { usePlanRuns } from '../api/designs';

export function PlanRunsPanel({ projectId, design, builds, labs, homeLabId }: { projectId: number; design: Design; builds: Build[]; labs: Lab[]; homeLabId: number | null }) {
  const plan = usePlanRuns(projectId);
  const [parentId, setParentId] = useState('');
  const [labsByBlock, setLabsByBlock] = useState<Record<string, string>>({});
  const [loading, setLoading] = useState('');
  const [area, setArea] = useState('');
  const [note, setNote] = useState('');
  const [done, setDone] = useState<Build[] | null>(null);
  const blocks = Array.from({ length: design.info.blocks }, (_, i) => i + 1);
  const parents = builds.filter((b) => b.status !== 'planned' && b.status !== 'discarded');

  const submit = () => {
    const byBlock: Record<string, number> = {};
    for (const block of blocks) {
      const chosen = labsByBlock[String(block)] ?? (homeLabId != null ? String(homeLabId) : '');
      if (chosen) byBlock[String(block)] = Number(chosen);
    }
    plan.mutate(
      {
        runs: design.runs,
        parentId: parentId ? Number(parentId) : null,
        labsByBlock: byBlock,
        loadingMgCm2: loading ? Number(loading) : null,
        areaCm2: area ? Number(area) : null,
        note: note.trim() || undefined,
        designKind: design.kind,
        seed: design.info.seed,
      },
      { onSuccess: (created) => setDone(created) },
    );
  };

  if (done) {
    return (
      <div role="status" className="flex flex-col gap-2 text-sm">
        <p><strong>{done.length} planned builds</strong> added: <span className="num">{done[0]?.code}</span> to <span className="num">{done[done.length - 1]?.code}</span>, in run order.</p>
        <p><Link to={`/projects/${projectId}`} className="text-copper-700 hover:underline">Open the builds table</Link> to record each one as it is made.</p>
        <div><Button onClick={() => { setDone(null); plan.reset(); }}>Plan again</Button></div>
      </div>
    );
  }
  return (
    <div className="flex flex-col gap-3">
      <div className="grid grid-cols-2 gap-3">
        <Field label="Parent build (optional)" hint="the build these recipes start from">
          {(p) => (
            <Select {...p} value={parentId} onChange={(e) => setParentId(e.target.value)}>
              <option value="">none</option>
              {parents.map((b) => <option key={b.id} value={b.id}>{b.code}{b.changeNote ? ` — ${b.changeNote.slice(0, 40)}` : ''}</option>)}
            </Select>
          )}
        </Field>
        <Field label="Note for every build" hint="written into each change note">
          {(p) => <Input {...p} value={note} maxLength={300} onChange={(e) => setNote(e.target.value)} placeholder="binder × activation screen" />}
        </Field>
        <Field label="Catalyst loading (mg/cm²)">{(p) => <Input {...p} inputMode="decimal" value={loading} onChange={(e) => setLoading(e.target.value)} placeholder="3.0" />}</Field>
        <Field label="Active area (cm²)">{(p) => <Input {...p} inputMode="decimal" value={area} onChange={(e) => setArea(e.target.value)} placeholder="25" />}</Field>
      </div>
      <div className="grid grid-cols-2 gap-3">
        {blocks.map((block) => (
          <Field key={block} label={`Lab for block ${block}`}>
            {(p) => (
              <Select {...p} value={labsByBlock[String(block)] ?? (homeLabId != null ? String(homeLabId) : '')} onChange={(e) => setLabsByBlock((s) => ({ ...s, [String(block)]: e.target.value }))}>
                <option value="">not set</option>
                {labs.map((l) => <option key={l.id} value={l.id}>{l.name}</option>)}
              </Select>
            )}
          </Field>
        ))}
      </div>
      <ErrorNote error={plan.error} />
      <div>
        <Button variant="primary" onClick={submit} disabled={plan.isPending}>{plan.isPending ? 'Planning…' : `Plan ${design.runs.length} builds`}</Button>
      </div>
    </div>
  );
}
