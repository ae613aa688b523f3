// The picture a PI shows a funder: best-to-date value of a target's metric against build date,
// with the target line and the due date.
import type { TargetView } from '@shared/api-types';
import { LazyPlot, OKABE_ITO } from '@/components/plot/lazy-plot';
import { formatDate } from '@/lib/format';
import { targetStatement } from './target-status';

export function TargetProgressChart({ target }: { target: TargetView }) {
  const series = target.status.series;
  const axisTitle = `${target.metricLabel} (${target.unit})`;
  const dates = series.map((p) => p.date);
  const first = dates[0];
  const last = [dates.at(-1), target.dueDate].filter(Boolean).sort().at(-1)!;
  const data: unknown[] = [
    {
      type: 'scatter', mode: 'markers', name: 'each build', x: dates, y: series.map((p) => p.value),
      text: series.map((p) => p.code), hovertemplate: `%{text}<br>%{x|%d %b %Y}<br>%{y} ${target.unit}<extra></extra>`,
      marker: { color: OKABE_ITO[4], size: 6, opacity: 0.7 },
    },
    {
      type: 'scatter', mode: 'lines', line: { shape: 'hv', color: OKABE_ITO[0], width: 2 }, name: 'best to date', x: dates, y: series.map((p) => p.best),
      text: series.map((p) => p.bestCode), hovertemplate: `best %{y} ${target.unit} (%{text})<extra></extra>`,
    },
    {
      type: 'scatter', mode: 'lines', name: `target ${targetStatement(target).replace(`${target.metricLabel} `, '')}`, x: [first, last], y: [target.value, target.value],
      line: { color: OKABE_ITO[3], dash: 'dash', width: 2 }, hoverinfo: 'skip',
    },
  ];
  const shapes = target.dueDate
    ? [{ type: 'line', xref: 'x', yref: 'paper', x0: target.dueDate, x1: target.dueDate, y0: 0, y1: 1, line: { color: '#555', dash: 'dot', width: 1 } }]
    : [];
  const annotations = target.dueDate
    ? [{ xref: 'x', yref: 'paper', x: target.dueDate, y: 1, yanchor: 'bottom', text: `due ${formatDate(target.dueDate)}`, showarrow: false, font: { size: 11 } }]
    : [];
  return (
    <LazyPlot
      data={data}
      title={target.name || targetStatement(target)}
      subtitle={[targetStatement(target), target.conditions].filter(Boolean).join(' · ')}
      fileName={`target-${(target.name || target.metric).replace(/\W+/g, '-').toLowerCase()}`}
      layout={{ xaxis: { title: { text: 'Build date' }, type: 'date' }, yaxis: { title: { text: axisTitle } }, shapes, annotations, legend: { orientation: 'h', y: -0.25 } }}
      style={{ height: 320 }}
    />
  );
}
