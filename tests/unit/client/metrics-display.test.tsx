// @vitest-environment jsdom
// Metric values as the build page shows them: display units and digits from the metric table,
// and a metric that could not be computed as "—" with the reason, never "null" or "NaN".
import { describe, expect, it } from 'vitest';
import { render, screen, within } from '@testing-library/react';
import type { CurveSummary, ProjectSettings } from '../../../shared/api-types';
import { DEFAULT_SETTINGS } from '../../../shared/schemas/project';
import { polarizationMetrics } from '../../../shared/curves';
import { MetricsList } from '../../../src/features/curves/components/metrics-panel';
import { answer, fixtures } from './render';

type Detail = { curves: CurveSummary[] };
const project = answer<{ project: { settings: ProjectSettings } }>('pi', `/projects/${fixtures.projectId}`).project;

/** The value line of the metric with this label. */
function valueOf(label: string): string {
  const item = within(screen.getByRole('list', { name: 'Metrics at the reference point' })).getAllByRole('listitem').find((li) => li.firstElementChild?.textContent === label);
  if (!item) throw new Error(`no metric labelled ${label}`);
  return item.children[1]!.textContent!;
}

describe('metrics list', () => {
  it('shows a stored curve’s metrics in display units with their digits', () => {
    const curve = answer<Detail>('pi', `/builds/${fixtures.testedBuildId}`).curves.find((c) => c.kind === 'polarization')!;
    render(<MetricsList result={curve} settings={project.settings} />);
    // the recorded curve stores V at j_ref 0.538983 V, j at V_ref 0.0747071 A/cm², HFR 0.12 Ω·cm²,
    // Tafel 98.3678 mV/dec, mass activity 30.1815 A/g; shown in mV (0 decimals), mA/cm² (1),
    // mΩ·cm² (0), mV/dec (1), A/g (2) — derived by hand
    expect(curve.metrics).toMatchObject({ vAtRef: expect.closeTo(0.538983, 6), hfr: 0.12 });
    expect(valueOf('V at j_ref')).toBe('539 mV');
    expect(valueOf('j at V_ref')).toBe('74.7 mA/cm²');
    expect(valueOf('HFR')).toBe('120 mΩ·cm²');
    expect(valueOf('Tafel slope')).toBe('98.4 mV/dec');
    // labelled by its potential and basis, from the project's reference point
    expect(valueOf(`Mass activity at ${project.settings.refVoltage.toFixed(2)} V${project.settings.irFree ? ' iR-free' : ''}, per g ${project.settings.loadingBasis}`)).toBe('30.18 A/g');
    expect(valueOf('Peak power')).toBe('287 mW/cm²');
    const text = screen.getByRole('list', { name: 'Metrics at the reference point' }).textContent!;
    expect(text).not.toMatch(/null|undefined|NaN|\d\.\d{5,}/);
  });

  it('shows a metric the curve cannot give as "—" with the reason', () => {
    // a curve that stays above V_ref = 0.6 V: no crossing, so no j at V_ref (derived by hand)
    const curve = { kind: 'polarization' as const, j: Float64Array.from([0, 0.05, 0.1, 0.2, 0.3]), v: Float64Array.from([0.95, 0.82, 0.77, 0.71, 0.66]) };
    const result = polarizationMetrics(curve, DEFAULT_SETTINGS, { loadingMgCm2: 3, metalLoadingMgCm2: null });
    expect(result.metrics.jAtRef).toBeNull();
    render(<MetricsList result={result} settings={DEFAULT_SETTINGS} />);
    const item = within(screen.getByRole('list', { name: 'Metrics at the reference point' })).getAllByRole('listitem').find((li) => li.firstElementChild?.textContent === 'j at V_ref')!;
    expect(item.children[1]!.textContent).toBe('— not available');
    expect(item.children[2]!.textContent).toBe(result.metricNotes.jAtRef);
    expect(result.metricNotes.jAtRef).toMatch(/\S/);
    expect(item.textContent).not.toMatch(/null|undefined|NaN/);
  });
});
