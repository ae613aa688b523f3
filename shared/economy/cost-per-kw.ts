// Precious-metal cost per kW of cell power, from metal prices the project records by hand.

/** A metal price as entered by a user: never fetched, always with its date and source. */
export interface MetalPrice {
  metal: string;
  /** price per gram of metal, in `currency` (> 0) */
  pricePerGram: number;
  /** currency code or sign as the team writes it, e.g. 'EUR', 'USD' */
  currency: string;
  /** the day the price holds for, YYYY-MM-DD */
  date: string;
  /** where the price came from (free text, e.g. "supplier quote 2024-11") */
  source: string;
}

export interface CostPerKw {
  /** cost of the priced metals per kW, or null when no metal has a price */
  costPerKw: number | null;
  currency: string | null;
  /** e.g. 'EUR/kW' */
  unit: string | null;
  byMetal: { metal: string; gPerKw: number; pricePerGram: number; currency: string; date: string; source: string; costPerKw: number }[];
  /** metals with a g/kW but no price (left out of the cost, said so) */
  unpriced: string[];
  /** caveats to print beside the figure */
  notes: string[];
  method: string;
}

const ISO_DATE = /^(\d{4})-(\d{2})-(\d{2})$/;

function checkDate(text: string, metal: string): void {
  const match = ISO_DATE.exec(text);
  if (!match) throw new RangeError(`costPerKw: the price of ${metal} needs a date as YYYY-MM-DD, got ${JSON.stringify(text)}`);
  const [year, month, day] = [Number(match[1]), Number(match[2]), Number(match[3])];
  const date = new Date(Date.UTC(year, month - 1, day));
  if (date.getUTCFullYear() !== year || date.getUTCMonth() !== month - 1 || date.getUTCDate() !== day) {
    throw new RangeError(`costPerKw: the price date of ${metal} is not a calendar date: ${text}`);
  }
}

/**
 * Precious-metal cost per kW.
 * Definition: cost/kW = Σ over metals of (g of metal per kW) × (price per g); a metal without a
 * price is left out and named in `unpriced`. All prices must be in one currency (no conversion is
 * made). Each price carries the date and source the user entered, and the result repeats them.
 * Reference: unit algebra (hand-worked: 1.2 g Pt/kW at 30 per g = 36 per kW).
 * Cost: O(metals).
 * @throws RangeError when a g/kW is negative or not finite, a price is not positive, a currency,
 *   source or metal name is empty, a date is not a YYYY-MM-DD calendar date, a metal is priced
 *   twice, or the prices use more than one currency.
 * @example costPerKw({ Pt: 1.2 }, [{ metal: 'Pt', pricePerGram: 30, currency: 'EUR', date: '2025-01-15', source: 'supplier quote' }]).costPerKw // 36
 */
export function costPerKw(gPerKwByMetal: Readonly<Record<string, number>>, prices: readonly MetalPrice[]): CostPerKw {
  if (gPerKwByMetal === null || typeof gPerKwByMetal !== 'object') throw new RangeError('costPerKw: gPerKwByMetal must be a record of g/kW per metal');
  if (!Array.isArray(prices)) throw new RangeError('costPerKw: prices must be an array');
  for (const [metal, value] of Object.entries(gPerKwByMetal)) {
    if (!(Number.isFinite(value) && value >= 0)) throw new RangeError(`costPerKw: g/kW of ${metal} must be a number ≥ 0, got ${value}`);
  }
  const byName = new Map<string, MetalPrice>();
  const currencies = new Set<string>();
  prices.forEach((price, index) => {
    if (price === null || typeof price !== 'object') throw new RangeError(`costPerKw: price ${index} must be an object`);
    const metal = typeof price.metal === 'string' ? price.metal.trim() : '';
    if (metal === '') throw new RangeError(`costPerKw: price ${index} needs a metal name`);
    if (byName.has(metal)) throw new RangeError(`costPerKw: ${metal} is priced twice`);
    if (!(Number.isFinite(price.pricePerGram) && price.pricePerGram > 0)) throw new RangeError(`costPerKw: the price of ${metal} must be a positive number per gram, got ${price.pricePerGram}`);
    const currency = typeof price.currency === 'string' ? price.currency.trim() : '';
    if (currency === '') throw new RangeError(`costPerKw: the price of ${metal} needs a currency`);
    if (typeof price.date !== 'string') throw new RangeError(`costPerKw: the price of ${metal} needs a date as YYYY-MM-DD`);
    checkDate(price.date, metal);
    if (typeof price.source !== 'string' || price.source.trim() === '') throw new RangeError(`costPerKw: the price of ${metal} needs a source (where the price came from)`);
    currencies.add(currency);
    byName.set(metal, { ...price, metal, currency, source: price.source.trim() });
  });
  if (currencies.size > 1) throw new RangeError(`costPerKw: the prices use more than one currency (${[...currencies].join(', ')}); enter them in one`);
  const currency = currencies.size === 1 ? [...currencies][0] : null;
  const byMetal: CostPerKw['byMetal'] = [];
  const unpriced: string[] = [];
  let total = 0;
  for (const [metal, gPerKw] of Object.entries(gPerKwByMetal)) {
    const price = byName.get(metal.trim());
    if (price === undefined) {
      if (gPerKw > 0) unpriced.push(metal);
      continue;
    }
    const cost = gPerKw * price.pricePerGram;
    byMetal.push({ metal: price.metal, gPerKw, pricePerGram: price.pricePerGram, currency: price.currency, date: price.date, source: price.source, costPerKw: cost });
    total += cost;
  }
  const notes: string[] = [];
  if (unpriced.length > 0) notes.push(`no price recorded for ${unpriced.join(', ')}: left out of the cost`);
  for (const entry of byMetal) notes.push(`${entry.metal} at ${entry.pricePerGram} ${entry.currency}/g (${entry.date}, ${entry.source})`);
  const priced = byMetal.length > 0;
  return {
    costPerKw: priced ? total : null,
    currency: priced ? currency : null,
    unit: priced ? `${currency}/kW` : null,
    byMetal,
    unpriced,
    notes,
    method: 'cost per kW = Σ (g of metal per kW × price per g) over the priced metals; prices as entered, with their date and source, never fetched',
  };
}
