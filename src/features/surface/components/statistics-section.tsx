// The full statistics behind the surface, for a statistician: summary figures, one test per
// term, the shape check against replicates, the whole-model test, coefficients in coded units,
// the model written in actual units, every build's fitted and left-out residuals, and the
// residual plots — closed until opened, and exportable as one CSV file.
import { useRef } from 'react';
import type { ResolvedFactor } from '@shared/doe/model/index';
import type { SurfaceResult } from '../api/surface';
import { LazyPlot, OKABE_ITO, exportPlot } from '@/components/plot/lazy-plot';
import { Button } from '@/components/ui/button';
import { displayOf, pValue, show, showSpread, sig } from './display';

function download(text: string, name: string) {
  const url = URL.createObjectURL(new Blob([text], { type: 'text/csv;charset=utf-8' }));
  const a = document.createElement('a');
  a.href = url;
  a.download = name;
  a.click();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}

/** The unit of an actual-units coefficient: response unit per product of factor units. */
function coefficientUnit(responseUnit: string, factors: ResolvedFactor[], powers: number[]): string {
  const parts: string[] = [];
  powers.forEach((power, i) => {
    const unit = factors[i]?.unit;
    if (power > 0 && unit) parts.push(power === 1 ? unit : `(${unit})${power === 2 ? '²' : power === 3 ? '³' : `^${power}`}`);
  });
  if (!parts.length) return responseUnit;
  return `${responseUnit} per ${parts.join('·')}`;
}

function Table({ label, head, rows, note }: { label: string; head: string[]; rows: (string | number)[][]; note?: string }) {
  return (
    <div className="overflow-x-auto">
      <table className="w-full text-sm" aria-label={label}>
        <caption className="mb-1 text-left text-xs font-semibold uppercase tracking-wide text-ink-500">{label}</caption>
        <thead className="text-left text-xs text-ink-700">
          <tr>{head.map((h, i) => <th key={h} scope="col" className={`py-1 pr-3 ${i > 0 ? 'text-right' : ''}`}>{h}</th>)}</tr>
        </thead>
        <tbody>
          {rows.map((row, r) => (
            <tr key={r} className="border-t border-line">
              {row.map((cell, c) => <td key={c} className={`py-1 pr-3 ${c > 0 ? 'num whitespace-nowrap text-right' : ''}`}>{cell}</td>)}
            </tr>
          ))}
        </tbody>
      </table>
      {note && <p className="mt-1 text-xs text-ink-500">{note}</p>}
    </div>
  );
}

function statistics(result: SurfaceResult) {
  const { fit } = result;
  const d = displayOf(result.response);
  const s2 = d.scale * d.scale;
  const u = d.unit || 'response unit';
  const anova = fit.anova;
  const factors = fit.basis.factors;
  const figures: [string, string][] = [
    ['Builds in the fit (distinct recipes)', `${fit.n} (${fit.distinctRuns})`],
    ['Residual standard deviation', showSpread(fit.rmse, d)],
    ['Left-out prediction error, √(PRESS/n)', result.quality.looRmse == null ? 'cannot be worked out: a build has leverage 1' : showSpread(result.quality.looRmse, d)],
    ['Spread of builds of one recipe', result.quality.replicateSd == null ? 'no recipe built twice' : showSpread(result.quality.replicateSd, d)],
    ['Share of the variation explained (R²)', fit.r2.toFixed(3)],
    ['R² adjusted for the number of terms', fit.adjR2.toFixed(3)],
    ['R² for left-out builds (1 − PRESS/SS total)', fit.predR2 == null ? 'cannot be worked out: a build has leverage 1' : fit.predR2.toFixed(3)],
    [`PRESS (${u}²)`, fit.press == null ? 'cannot be worked out' : sig(fit.press * s2)],
  ];
  const termTests = anova.terms.map((t) => [t.label, t.df, sig(t.ss * s2), sig(t.f, 3), pValue(t.p), t.p != null && t.p < 0.05 ? 'yes' : 'no']);
  const wholeModel = [
    ['Explained by the model', anova.model.df, sig(anova.model.ss * s2), sig(anova.model.ms * s2), sig(anova.model.f, 3), pValue(anova.model.p)],
    ['Left unexplained', anova.residual.df, sig(anova.residual.ss * s2), sig(anova.residual.ms * s2), '', ''],
    ['Total about the mean', anova.total.df, sig(anova.total.ss * s2), '', '', ''],
  ];
  const shape = anova.lackOfFit && anova.pureError
    ? [
        ['Misfit of the model’s shape (lack of fit)', anova.lackOfFit.df, sig(anova.lackOfFit.ss * s2), sig(anova.lackOfFit.ms * s2), sig(anova.lackOfFit.f, 3), pValue(anova.lackOfFit.p)],
        ['Builds of one recipe (pure error)', anova.pureError.df, sig(anova.pureError.ss * s2), sig(anova.pureError.ms * s2), '', ''],
      ]
    : null;
  const coded = fit.coefficients.map((c) => [c.label === 'Constant' ? 'Constant (centre of every range, first level)' : c.label, c.aliased ? 'not estimated' : sig(c.coded * d.scale), sig(c.codedSE == null ? null : c.codedSE * d.scale), sig(c.t, 3), pValue(c.p), c.vif == null ? '—' : `${sig(c.vif, 3)}${c.vif > 10 ? ' ▲' : ''}`]);
  const actual = fit.coefficients.map((c, j) => [c.label, sig(c.actual * d.scale), sig(c.actualSE == null ? null : c.actualSE * d.scale), coefficientUnit(d.unit, factors, fit.basis.columns[j]!.powers)]);
  const highLeverage = (2 * fit.basis.estimated.length) / Math.max(1, fit.n);
  const builds = result.runs.map((r) => [r.code, show(r.observed, d), show(r.predicted, d), show(r.residual, d, 1), r.looResidual == null ? '— (leverage 1)' : show(r.looResidual, d, 1), `${r.leverage.toFixed(3)}${r.leverage > highLeverage ? ' ◆' : ''}`]);
  return { figures, termTests, wholeModel, shape, coded, actual, builds, u, highLeverage };
}

export function StatisticsSection({ result, subtitle }: { result: SurfaceResult; subtitle: string }) {
  const st = statistics(result);
  const d = displayOf(result.response);
  const csv = async () => {
    const rows: (string | number)[][] = [
      [`Cellwright surface statistics: ${d.label} (${st.u})`, subtitle],
      [],
      ['Summary figure', 'value'],
      ...st.figures,
      [],
      ['Term', 'df', `partial SS (${st.u}²)`, 'F', 'p', 'clear at 95 %'],
      ...st.termTests,
      [],
      ['Whole model', 'df', `SS (${st.u}²)`, `MS (${st.u}²)`, 'F', 'p'],
      ...st.wholeModel,
      ...(st.shape ? [[], ['Shape check', 'df', `SS (${st.u}²)`, `MS (${st.u}²)`, 'F', 'p'], ...st.shape] : []),
      [],
      ['Coefficient, coded units (−1…+1)', `estimate (${st.u})`, 'SE', 't', 'p', 'VIF'],
      ...st.coded,
      [],
      ['Coefficient, actual units', 'estimate', 'SE', 'unit'],
      ...st.actual,
      [],
      ['Build', `measured (${st.u})`, 'fitted', 'residual', 'left-out residual', 'leverage'],
      ...st.builds,
    ];
    // the one CSV writer (formula-looking text made inert), loaded with the click
    const { writeCsv } = await import('@shared/csv/write-csv');
    download(writeCsv(rows), `surface-statistics-${result.response.key}.csv`);
  };
  return (
    <div className="flex flex-col gap-5">
      <div className="flex justify-end"><Button onClick={csv}>Download statistics (CSV)</Button></div>
      <dl className="grid grid-cols-1 gap-x-6 gap-y-1 text-sm sm:grid-cols-2">
        {st.figures.map(([k, v]) => (
          <div key={k} className="flex justify-between gap-3 border-b border-line py-1"><dt className="text-ink-700">{k}</dt><dd className="num text-ink-950">{v}</dd></div>
        ))}
      </dl>
      <Table label="Does each term matter? (partial F-tests)" head={['Term', 'df', `Partial SS (${st.u}²)`, 'F', 'p', 'Clear at 95 %']} rows={st.termTests} note="Each term is tested given all the others in the model." />
      <div className="grid gap-5 xl:grid-cols-2">
        <Table label="The model as a whole" head={['Source', 'df', `SS (${st.u}²)`, `MS (${st.u}²)`, 'F', 'p']} rows={st.wholeModel} />
        {st.shape ? (
          <Table label="Shape check against repeated recipes" head={['Source', 'df', `SS (${st.u}²)`, `MS (${st.u}²)`, 'F', 'p']} rows={st.shape} note="A small p says the model's shape misses something the repeated builds show." />
        ) : (
          <p className="text-sm text-ink-500">No shape check: it needs a recipe built more than once and more distinct recipes than model terms.</p>
        )}
      </div>
      <Table label="Coefficients in coded units (each factor −1…+1 over its range)" head={['Term', `Estimate (${st.u})`, 'SE', 't', 'p', 'VIF']} rows={st.coded} note="VIF above 10 (▲): the term is strongly correlated with others in these builds and its estimate is unstable." />
      <Table label="The model in actual units" head={['Term', 'Coefficient', 'SE', 'Unit']} rows={st.actual} note="Multiply each coefficient by its factors in their own units (levels: 1 at the named level, 0 otherwise) and add them up." />
      <Table label="Builds in the fit" head={['Build', `Measured (${st.u})`, 'Fitted', 'Residual', 'Left-out residual', 'Leverage']} rows={st.builds} note={`Left-out residual: measured minus the prediction from a fit without that build. ◆ leverage above 2p/n = ${st.highLeverage.toFixed(2)}: the build steers the fit strongly.`} />
      <ResidualPlots result={result} subtitle={subtitle} />
    </div>
  );
}

function ResidualPlots({ result, subtitle }: { result: SurfaceResult; subtitle: string }) {
  const box = useRef<HTMLDivElement>(null);
  const d = displayOf(result.response);
  const predicted = result.runs.map((r) => r.predicted * d.scale);
  const observed = result.runs.map((r) => r.observed * d.scale);
  const left = result.runs.map((r) => (r.looResidual ?? Number.NaN) * d.scale);
  const text = result.runs.map((r) => r.code);
  const lo = Math.min(...predicted, ...observed);
  const hi = Math.max(...predicted, ...observed);
  const axisTitle = `${d.label} (${d.unit})`;
  return (
    <div ref={box}>
      <div className="mb-1 flex justify-end gap-1.5">
        <Button onClick={() => exportPlot(box.current, 'png', 'residuals')}>PNG</Button>
        <Button onClick={() => exportPlot(box.current, 'svg', 'residuals')}>SVG</Button>
      </div>
      <div className="grid gap-3 xl:grid-cols-2">
        <LazyPlot
          fileName="left-out-residuals"
          style={{ height: 320 }}
          data={[{ x: predicted, y: left, text, type: 'scatter', mode: 'markers', name: 'builds', marker: { color: OKABE_ITO[0], size: 8 }, hovertemplate: `%{text}<br>fitted %{x:.4g} ${d.unit}<br>left-out residual %{y:.3g} ${d.unit}<extra></extra>` }]}
          layout={{
            title: { text: `Left-out residuals<br><span style="font-size:11px;color:#56668c">${subtitle}</span>` },
            xaxis: { title: { text: `Fitted ${axisTitle}` }, gridcolor: '#eeeae2' },
            yaxis: { title: { text: `Measured − predicted without it (${d.unit})` }, gridcolor: '#eeeae2', zeroline: true, zerolinecolor: '#a9b4cc' },
            showlegend: false,
            margin: { l: 70, r: 24, t: 56, b: 56 },
          }}
          config={{ displayModeBar: false }}
        />
        <LazyPlot
          fileName="fitted-vs-measured"
          style={{ height: 320 }}
          data={[
            { x: observed, y: predicted, text, type: 'scatter', mode: 'markers', name: 'builds', marker: { color: OKABE_ITO[1], size: 8 }, hovertemplate: `%{text}<br>measured %{x:.4g} ${d.unit}<br>fitted %{y:.4g} ${d.unit}<extra></extra>` },
            { x: [lo, hi], y: [lo, hi], type: 'scatter', mode: 'lines', name: 'fitted = measured', line: { color: '#56668c', dash: 'dash', width: 1 } },
          ]}
          layout={{
            title: { text: `Fitted against measured<br><span style="font-size:11px;color:#56668c">${subtitle}</span>` },
            xaxis: { title: { text: `Measured ${axisTitle}` }, gridcolor: '#eeeae2' },
            yaxis: { title: { text: `Fitted ${axisTitle}` }, gridcolor: '#eeeae2' },
            legend: { orientation: 'h', y: -0.3 },
            margin: { l: 70, r: 24, t: 56, b: 80 },
          }}
          config={{ displayModeBar: false }}
        />
      </div>
    </div>
  );
}
