// Impedance columns found by their headers, in the ways stations write them, and the spectrum
// read from them: units, the sign of Z″, |Z| with phase, rows left out, and refusals.
import { describe, expect, it } from 'vitest';
import { parseDelimitedText } from '../../../shared/curves';
import { detectImpedanceColumns, impedanceUnit, spectrumFromTable } from '../../../shared/impedance';

const table = (text: string) => parseDelimitedText(text);

describe('detectImpedanceColumns', () => {
  it.each([
    ["Freq (Hz),Z' (Ohm),-Z'' (Ohm)", 'Hz', 'ohm', true],
    ['Frequency/kHz;Re(Z)/mOhm cm2;Im(Z)/mOhm cm2', 'kHz', 'mohm*cm2', false],
    ['f [Hz]\tZreal [Ω·cm²]\tZimag [Ω·cm²]', 'Hz', 'ohm*cm2', false],
    ['Frequency (Hz),Z_re (mΩ),-Z_im (mΩ)', 'Hz', 'mohm', true],
  ])('reads %s', (header, fUnit, zUnit, negated) => {
    const delimiter = header.includes(';') ? ';' : header.includes('\t') ? '\t' : ',';
    const rows = [header, ['1000', '0.3', '-0.1'].join(delimiter), ['100', '0.5', '-0.3'].join(delimiter), ['10', '0.6', '-0.1'].join(delimiter)];
    const detection = detectImpedanceColumns(table(rows.join('\n')));
    expect(detection.mapping?.frequency.unit).toBe(fUnit);
    expect(detection.mapping?.zReal?.unit).toBe(zUnit);
    expect(Boolean(detection.mapping?.zImag?.negatedHeader)).toBe(negated);
  });

  it('falls back to |Z| and phase, and finds nothing in a polarization file', () => {
    const polar = detectImpedanceColumns(table('Freq (Hz),|Z| (Ohm cm2),Phase (deg)\n1000,0.3,-10\n100,0.5,-30\n10,0.6,-5\n'));
    expect(polar.mapping?.magnitude?.column).toBe(1);
    expect(polar.mapping?.phase?.unit).toBe('deg');
    expect(detectImpedanceColumns(table('Current density (A/cm2),Voltage (V)\n0,0.95\n0.2,0.6\n')).mapping).toBeNull();
  });

  it('names impedance units', () => {
    expect(impedanceUnit('Z (Ohm*cm^2)')).toBe('ohm*cm2');
    expect(impedanceUnit('Z (mohm)')).toBe('mohm');
    expect(impedanceUnit('Z')).toBeNull();
  });
});

describe('spectrumFromTable', () => {
  it('converts kHz, mΩ totals and −Z″ to Hz, Ω·cm² and Z″ = Im Z, sorted by falling frequency', () => {
    const t = table("f (kHz),Z' (mOhm),-Z'' (mOhm)\n0.01,24,4\n1,12,2\n0.1,20,8\n");
    const s = spectrumFromTable(t, detectImpedanceColumns(t).mapping!, 25);
    // derived by hand: 1 kHz → 1000 Hz; 12 mΩ × 25 cm² = 0.3 Ω·cm²; −Z″ = 2 mΩ → Z″ = −0.05 Ω·cm²
    expect(Array.from(s.frequencyHz)).toEqual([1000, 100, 10]);
    expect(s.zReal[0]).toBeCloseTo(0.3, 12);
    expect(s.zImag[0]).toBeCloseTo(-0.05, 12);
    expect(s.convention).toBe('negated');
    expect(s.notes.join(' ')).toMatch(/area-normalised with the active area 25 cm²/);
  });

  it('computes Z′ = |Z| cos φ and Z″ = |Z| sin φ, and leaves out rows without a frequency', () => {
    const t = table('Freq (Hz),|Z| (Ohm cm2),Phase (deg)\n1000,2,-30\n0,1,0\n100,1,-90\n10,1,0\n');
    const s = spectrumFromTable(t, detectImpedanceColumns(t).mapping!, null);
    expect(s.zReal[0]).toBeCloseTo(Math.sqrt(3), 12); // 2·cos 30° = √3 (derived by hand)
    expect(s.zImag[0]).toBeCloseTo(-1, 12); // 2·sin(−30°) = −1
    expect(s.frequencyHz).toHaveLength(3);
    expect(s.notes.join(' ')).toMatch(/1 row without a positive frequency/);
  });

  it('refuses a total impedance without an area and a spectrum of two readings', () => {
    const t = table("Freq (Hz),Z' (Ohm),Z'' (Ohm)\n1000,0.01,-0.001\n100,0.02,-0.004\n10,0.03,-0.001\n");
    expect(() => spectrumFromTable(t, detectImpedanceColumns(t).mapping!, null)).toThrow(/no active area/);
    const short = table("Freq (Hz),Z' (Ohm cm2),Z'' (Ohm cm2)\n1000,0.3,-0.1\n100,0.5,-0.3\n");
    expect(() => spectrumFromTable(short, detectImpedanceColumns(short).mapping!, null)).toThrow(/at least 3/);
  });
});
