// Review pack: the page a PI takes into a programme review — the waterfall of the best path, the
// top builds with their metrics, the durability summary and the builds waiting for a verdict, for
// an optional date range. Prints cleanly (print stylesheet: no rail, no buttons, a section per
// block) and downloads as a PDF drawn on the server from the same answer.
import type { ReactNode } from 'react';
import { Link, useParams, useSearchParams } from 'react-router-dom';
import { useReviewPack, reviewPackPdfUrl } from '@/features/review/api/review-pack';
import { WaterfallChart } from '@/features/gains/components/waterfall-chart';
import { TargetList } from '@/features/targets/components/target-status';
import { targetLinesFor } from '@/features/targets/components/target-lines';
import { PageHeader, Panel, Loading, ErrorNote, EmptyState } from '@/components/ui/panel';
import { Button } from '@/components/ui/button';
import { Field, Input } from '@/components/ui/field';
import { formatDate, formatMetric, formatNumber } from '@/lib/format';
import type { ReviewPack } from '@shared/api-types';

const th = 'px-2 py-1.5 text-left text-xs font-semibold text-ink-700';
const td = 'px-2 py-1.5 align-top';

function Section({ title, children }: { title: string; children: ReactNode }) {
  return (
    <section className="pack-section" aria-label={title}>
      <Panel title={title} className="mb-4 print:border-0 print:shadow-none">{children}</Panel>
    </section>
  );
}

function TargetsSection({ pack }: { pack: ReviewPack }) {
  return (
    <Section title="Targets">
      {pack.targets.length === 0
        ? <EmptyState title="No targets yet">A PI sets the programme’s targets on the project’s Targets page.</EmptyState>
        : <TargetList targets={pack.targets} />}
    </Section>
  );
}

function WaterfallSection({ pack }: { pack: ReviewPack }) {
  const subtitle = `at j_ref = ${formatNumber(pack.project.refCurrentDensity, 2)} A/cm² · lineage’s best path · 95 % intervals`;
  return (
    <Section title={`Waterfall of ${pack.response.label}`}>
      {pack.gains && pack.gains.steps.length >= 2
        // at most the printable width of an A4 page, so the chart prints as it shows
        ? <div className="max-w-[680px]"><WaterfallChart data={pack.gains} subtitle={subtitle} fileName={`review-pack-waterfall-${pack.project.codePrefix}`} targets={targetLinesFor(pack.targets, pack.gains.response.key, pack.gains.unit)} project={pack.project.name} /></div>
        : <EmptyState title="No waterfall yet">{pack.gainsNote ?? 'Upload polarization curves to the builds of a lineage to see its gains.'}</EmptyState>}
    </Section>
  );
}

function TopBuildsSection({ pack }: { pack: ReviewPack }) {
  const columns = ['vAtRef', 'vAtRefIrFree', 'massActivity', 'peakPower', 'hfr'] as const;
  const labels: Record<(typeof columns)[number], string> = { vAtRef: 'V at j_ref', vAtRefIrFree: 'iR-free V at j_ref', massActivity: 'Mass activity', peakPower: 'Peak power', hfr: 'HFR' };
  return (
    <Section title="Top builds">
      {pack.topBuilds.length === 0 ? <EmptyState title="No measured build in this period">Builds count here once a polarization curve of record is uploaded.</EmptyState> : (
        <div className="overflow-x-auto">
          <table className="w-full text-sm">
            <thead><tr className="border-b border-line"><th className={th}>Build</th><th className={th}>Tested</th>{columns.map((c) => <th key={c} className={`${th} text-right`}>{labels[c]}</th>)}<th className={th}>Change</th></tr></thead>
            <tbody>
              {pack.topBuilds.map((b) => (
                <tr key={b.buildId} className="border-b border-line/60">
                  <td className={td}><Link className="font-medium text-copper-700 hover:underline" to={`/projects/${pack.project.id}/builds/${b.buildId}`}>{b.code}</Link></td>
                  <td className={td}>{formatDate(b.testedOn)}</td>
                  {columns.map((c) => <td key={c} className={`${td} num text-right`}>{formatMetric(c, b.values[c])}</td>)}
                  <td className={`${td} text-ink-700`}>{b.changeNote ?? '—'}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </Section>
  );
}

function DurabilitySection({ pack }: { pack: ReviewPack }) {
  return (
    <Section title="Durability">
      {pack.durability.length === 0 ? <EmptyState title="No durability log of record in this period">Upload a durability log to a build to see its degradation rate here.</EmptyState> : (
        <table className="w-full text-sm">
          <thead><tr className="border-b border-line"><th className={th}>Build</th><th className={`${th} text-right`}>Degradation rate</th><th className={`${th} text-right`}>95 % interval</th><th className={`${th} text-right`}>Hours run</th><th className={`${th} text-right`}>Break-in</th></tr></thead>
          <tbody>
            {pack.durability.map((d) => (
              <tr key={d.buildId} className="border-b border-line/60">
                <td className={td}>{d.code}</td>
                <td className={`${td} num text-right`}>{formatMetric('degradationRate', d.degradationRate)}</td>
                <td className={`${td} num text-right`}>{d.low != null && d.high != null ? `${formatNumber(d.low, 1)} to ${formatNumber(d.high, 1)} µV/h` : '—'}</td>
                <td className={`${td} num text-right`}>{d.hoursRun == null ? '—' : `${formatNumber(d.hoursRun, 0)} h`}</td>
                <td className={`${td} num text-right`}>{d.breakInHours == null ? '—' : `${formatNumber(d.breakInHours, 0)} h`}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
    </Section>
  );
}

function WaitingSection({ pack }: { pack: ReviewPack }) {
  return (
    <Section title="Waiting for a verdict">
      {pack.openThreads.length === 0 ? <p className="text-sm text-ink-700">No tested build is waiting for a verdict.</p> : (
        <table className="w-full text-sm">
          <thead><tr className="border-b border-line"><th className={th}>Build</th><th className={th}>Tested</th><th className={`${th} text-right`}>Waiting</th><th className={th}>Last comment</th></tr></thead>
          <tbody>
            {pack.openThreads.map((t) => (
              <tr key={t.buildId} className="border-b border-line/60">
                <td className={td}><Link className="font-medium text-copper-700 hover:underline" to={`/projects/${pack.project.id}/builds/${t.buildId}`}>{t.code}</Link></td>
                <td className={td}>{formatDate(t.testedOn)}</td>
                <td className={`${td} num text-right`}>{t.waitingDays == null ? '—' : `${t.waitingDays} d`}</td>
                <td className={`${td} text-ink-700`}>{t.lastComment ? `${t.lastComment.author}: ${t.lastComment.body}` : 'no comment yet'}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
    </Section>
  );
}

/** The pack's sections, in the order they print. */
const SECTIONS: ((props: { pack: ReviewPack }) => ReactNode)[] = [TargetsSection, WaterfallSection, TopBuildsSection, DurabilitySection, WaitingSection];

export default function ReviewPackPage() {
  const projectId = Number(useParams().projectId);
  const [params, setParams] = useSearchParams();
  const period = { from: params.get('from'), to: params.get('to') };
  const pack = useReviewPack(projectId, period);
  const setPeriod = (key: 'from' | 'to', value: string) => {
    const next = new URLSearchParams(params);
    if (value) next.set(key, value);
    else next.delete(key);
    setParams(next, { replace: true });
  };
  const data = pack.data;
  const periodText = period.from || period.to ? `Builds from ${period.from ? formatDate(period.from) : 'the start'} to ${period.to ? formatDate(period.to) : 'today'}` : 'All builds of the project';
  return (
    <div className="review-pack max-w-6xl">
      <PageHeader
        eyebrow={data ? <Link to={`/projects/${projectId}`} className="hover:underline">{data.project.name}</Link> : undefined}
        title="Review pack"
        subtitle={data ? `${periodText} · reference point j_ref = ${formatNumber(data.project.refCurrentDensity, 2)} A/cm², V_ref = ${formatNumber(data.project.refVoltage, 2)} V · made ${formatDate(data.generatedAt)}` : 'The project on a few pages, for a programme review.'}
        actions={
          <div className="print-hidden flex flex-wrap items-end gap-2">
            <Button type="button" onClick={() => window.print()}>Print…</Button>
            <a className="inline-flex items-center rounded-md bg-copper-600 px-3 py-1.5 text-sm font-medium text-white hover:bg-copper-700" href={reviewPackPdfUrl(projectId, period)} download>Download PDF</a>
          </div>
        }
      />
      <div className="print-hidden mb-4 flex flex-wrap gap-4">
        <Field label="From (tested on or after)">{(p) => <Input {...p} type="date" value={period.from ?? ''} onChange={(e) => setPeriod('from', e.target.value)} />}</Field>
        <Field label="To (tested on or before)">{(p) => <Input {...p} type="date" value={period.to ?? ''} onChange={(e) => setPeriod('to', e.target.value)} />}</Field>
      </div>
      {pack.isLoading ? <Loading label="Putting the pack together…" /> : pack.error || !data ? <ErrorNote error={pack.error} /> : (
        <>
          {data.project.description && <p className="mb-4 max-w-3xl text-sm text-ink-700">{data.project.description}</p>}
          {SECTIONS.map((Render, index) => <Render key={index} pack={data} />)}
        </>
      )}
    </div>
  );
}
