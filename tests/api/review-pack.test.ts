// The review pack: one answer for the page and the PDF — the best path's waterfall, the top builds,
// the durability summary and the builds waiting for a verdict, within an optional date range.
import { describe, expect, it } from 'vitest';
import { demoHarness } from './harness';
import { pdfText } from '../browser/pdf-text.mjs';

const t = demoHarness();

describe('review pack', () => {
  it('answers the waterfall of the best path, the top builds by V at j_ref and the waiting builds', async () => {
    const res = await t.h.as.viewer.get(`/api/projects/${t.ids.project('C')}/review-pack`);
    expect(res.status).toBe(200);
    const pack = res.body;
    expect(pack.response.key).toBe('vAtRef');
    expect(pack.gains.chain).toBe('best-path');
    expect(pack.gains.steps.length).toBeGreaterThanOrEqual(2);
    const tops = pack.topBuilds.map((b: { values: { vAtRef: number } }) => b.values.vAtRef);
    expect(tops.length).toBeGreaterThan(0);
    expect(tops.length).toBeLessThanOrEqual(5);
    expect([...tops].sort((a, b) => b - a)).toEqual(tops); // best first
    for (const t of pack.openThreads) expect(typeof t.code).toBe('string');
  });

  it('keeps to the date range and refuses a range that runs backwards, naming the field', async () => {
    const none = await t.h.as.viewer.get(`/api/projects/${t.ids.project('C')}/review-pack?from=1990-01-01&to=1990-12-31`);
    expect(none.status).toBe(200);
    expect(none.body.topBuilds).toEqual([]);
    expect(none.body.period).toEqual({ from: '1990-01-01', to: '1990-12-31' });
    const bad = await t.h.as.viewer.get(`/api/projects/${t.ids.project('C')}/review-pack?from=2026-05-01&to=2026-04-01`);
    expect(bad.status).toBe(400);
    expect(JSON.stringify(bad.body.error)).toContain('to');
    const notDate = await t.h.as.viewer.get(`/api/projects/${t.ids.project('C')}/review-pack?from=May`);
    expect(notDate.status).toBe(400);
  });

  it('hands out a PDF that holds the project, the waterfall and the top builds as text', async () => {
    const res = await t.h.as.pi.get(`/api/projects/${t.ids.project('C')}/review-pack.pdf`).buffer(true).parse((r, cb) => { const chunks: Buffer[] = []; r.on('data', (c: Buffer) => chunks.push(c)); r.on('end', () => cb(null, Buffer.concat(chunks))); });
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/pdf');
    const pdf = res.body as Buffer;
    expect(pdf.subarray(0, 5).toString()).toBe('%PDF-');
    const text = pdfText(pdf);
    const pack = (await t.h.as.pi.get(`/api/projects/${t.ids.project('C')}/review-pack`)).body;
    expect(text).toContain(pack.project.name);
    expect(text).toContain('Waterfall of V at j_ref');
    expect(text).toContain('Top builds');
    expect(text).toContain('Targets');
    for (const target of pack.targets) expect(text).toContain(target.name || target.metricLabel);
    for (const step of pack.gains.steps) expect(text).toContain(step.code);
  });
});
