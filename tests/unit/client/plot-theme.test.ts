// The plot theme: no library toolbar or outside service in the configuration, round ticks for
// secondary axes, titles wrapped to the chart's width, callers' legends kept where they put them.
import { describe, expect, it } from 'vitest';
import { PLOT_CONFIG, QUANTITY_STYLE, roundAxis, themedData, themedLayout, wrapLine } from '@/components/plot/theme';

describe('plot configuration', () => {
  it('hides the toolbar and every link to an outside chart service', () => {
    expect(PLOT_CONFIG.displayModeBar).toBe(false);
    expect(PLOT_CONFIG.displaylogo).toBe(false);
    expect(PLOT_CONFIG.showLink).toBe(false);
    expect(PLOT_CONFIG.showSendToCloud).toBe(false);
    expect(PLOT_CONFIG.plotlyServerURL).toBe('');
  });

  it('draws voltage, iR-free voltage and power in different colours and dashes', () => {
    const styles = Object.values(QUANTITY_STYLE);
    expect(new Set(styles.map((s) => s.color)).size).toBe(3);
    expect(new Set(styles.map((s) => s.dash)).size).toBe(3);
  });
});

describe('roundAxis', () => {
  it('chooses 1, 2, 2.5 or 5 × 10^k steps and ends on a tick', () => {
    // worked by hand: 340 mW/cm² over ~5 ticks → step 100, top 400
    expect(roundAxis(340, 5)).toEqual({ range: [0, 400], dtick: 100 });
    // 1.004 V over ~6 ticks → raw 0.167 → step 0.2, top 1.2
    expect(roundAxis(1.004, 6)).toEqual({ range: [0, 1.2], dtick: 0.2 });
    expect(roundAxis(0.046, 5)).toEqual({ range: [0, 0.05], dtick: 0.01 });
    for (const max of [0.7, 3.3, 17, 128, 999, 2500]) {
      const { range, dtick } = roundAxis(max, 5);
      const mantissa = dtick / 10 ** Math.floor(Math.log10(dtick));
      expect([1, 2, 2.5, 5]).toContain(Number(mantissa.toPrecision(6)));
      expect(range[1]).toBeGreaterThanOrEqual(max);
      expect(Number((range[1] / dtick).toPrecision(9)) % 1).toBe(0);
    }
  });

  it('has a sensible axis for an empty plot', () => {
    expect(roundAxis(0)).toEqual({ range: [0, 1], dtick: 0.2 });
  });
});

describe('themedLayout', () => {
  it('wraps a long subtitle at phone width and makes room for it', () => {
    const wide = themedLayout({}, { width: 1000, title: 'C-010 · polarization', subtitle: '180 °C · H2/air · 0 kPa(g) · j_ref 0.2 A/cm² · V_ref 0.6 V' });
    const phone = themedLayout({}, { width: 340, title: 'C-010 · polarization', subtitle: '180 °C · H2/air · 0 kPa(g) · j_ref 0.2 A/cm² · V_ref 0.6 V' });
    const lines = (l: Record<string, unknown>) => String((l.title as { text: string }).text).split('<br>').length;
    expect(lines(wide)).toBe(2);
    expect(lines(phone)).toBeGreaterThan(2);
    expect((phone.margin as { t: number }).t).toBeGreaterThan((wide.margin as { t: number }).t);
  });

  it('splits the older "title<br><span>subtitle</span>" form into title and subtitle', () => {
    const layout = themedLayout({ title: { text: 'Residuals<br><span style="font-size:11px">linear model</span>' } }, { width: 800 });
    expect(String((layout.title as { text: string }).text)).toMatch(/^Residuals<br><span style="[^"]*">linear model<\/span>$/);
  });

  it('gives every axis automargin (no clipped titles) and keeps a caller legend in plot coordinates', () => {
    const layout = themedLayout({ yaxis2: { title: { text: 'P' } }, legend: { y: -0.3 } }, { width: 800 });
    expect((layout.xaxis as { automargin: boolean }).automargin).toBe(true);
    expect((layout.yaxis2 as { automargin: boolean }).automargin).toBe(true);
    expect((layout.legend as { yref: string }).yref).toBe('paper');
    expect((themedLayout({}, { width: 800 }).legend as { yref: string }).yref).toBe('container');
  });

  it('wraps long legend names to the chart width', () => {
    const [trace] = themedData([{ name: 'C-001 (baseline: lot FNC-24-07, 20 wt % PTFE, 1 h at 320 °C)' }], 340) as { name: string }[];
    expect(trace!.name).toContain('<br>');
    expect(wrapLine('a b c', 80)).toEqual(['a b c']);
  });
});
