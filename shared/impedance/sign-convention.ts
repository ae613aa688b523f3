// Which sign a file's imaginary column uses: Z″ itself (negative on a capacitive arc) or −Z″
// (positive on a capacitive arc, as many analysers write it for the Nyquist plot).

export interface SignConvention {
  /** 'imaginary': the column is Z″ (capacitive < 0); 'negated': the column is −Z″ (capacitive > 0) */
  convention: 'imaginary' | 'negated';
  /** share of Σ|value| on the side read as capacitive, 0.5–1 */
  capacitiveShare: number;
  /** the two sides are too close to call (share below 0.75): the reading should be confirmed */
  ambiguous: boolean;
  note: string;
}

/** Below this capacitive share the reading is flagged as ambiguous. */
const CLEAR_SHARE = 0.75;

/**
 * Detects the sign convention of an imaginary-impedance column.
 * Method: electrode spectra are dominated by capacitive arcs (double layer, charge transfer,
 * diffusion), where Im Z < 0; lead inductance or low-frequency inductive loops are small beside
 * them. So the sum of |values| on the negative side is compared with that on the positive side:
 * the larger one is the capacitive side. A share under 75 % is flagged as ambiguous.
 * Reference: Orazem & Tribollet, "Electrochemical Impedance Spectroscopy" (Wiley), on the
 * convention Z = Z_r + jZ_j with capacitive Z_j < 0 and Nyquist plots of −Z_j; common practice in
 * the trade for files that write −Z″.
 * Cost: O(n).
 * @throws RangeError when the column is empty, holds a non-finite value, or is zero throughout.
 * @example detectSignConvention([0.01, 0.05, 0.08, 0.04]).convention // 'negated'
 */
export function detectSignConvention(imaginaryColumn: ArrayLike<number>): SignConvention {
  if (imaginaryColumn === null || typeof imaginaryColumn !== 'object' || typeof imaginaryColumn.length !== 'number' || imaginaryColumn.length === 0) {
    throw new RangeError('detectSignConvention: the imaginary column must be a non-empty array');
  }
  let negative = 0;
  let positive = 0;
  for (let i = 0; i < imaginaryColumn.length; i++) {
    const value = imaginaryColumn[i];
    if (!Number.isFinite(value)) throw new RangeError(`detectSignConvention: value ${i} is not a finite number: ${value}`);
    if (value < 0) negative -= value;
    else positive += value;
  }
  const total = negative + positive;
  if (total === 0) throw new RangeError('detectSignConvention: the imaginary column is zero throughout: no arc to read the sign from');
  const convention = negative >= positive ? 'imaginary' : 'negated';
  const share = Math.max(negative, positive) / total;
  const ambiguous = share < CLEAR_SHARE;
  const sideText = convention === 'imaginary' ? 'Z″ (capacitive arcs negative)' : '−Z″ (capacitive arcs positive), sign turned';
  return {
    convention,
    capacitiveShare: share,
    ambiguous,
    note: `imaginary column read as ${sideText}: ${(share * 100).toFixed(0)} % of its magnitude is on that side${ambiguous ? ' — too close to call, please confirm' : ''}`,
  };
}
