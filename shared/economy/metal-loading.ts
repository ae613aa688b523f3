// Precious-metal loading of an MEA: per electrode and in total, from the catalyst loading and the
// metal content of the catalyst (wt %), per metal.

/** One metal in an electrode's catalyst: its content in the catalyst, or its loading directly. */
export interface MetalContent {
  /** metal name or symbol as the team writes it, e.g. 'Pt', 'Ru' */
  metal: string;
  /** metal content of the catalyst, wt % (0–100]; give this or loadingMgCm2 */
  contentWtPct?: number;
  /** the metal's loading itself, mg/cm², when recorded directly */
  loadingMgCm2?: number;
}

/** One electrode of a build. */
export interface ElectrodeLoading {
  /** 'anode', 'cathode' or any label; unique within the build */
  electrode: string;
  /** whole-catalyst loading, mg/cm² (needed for metals given by content) */
  catalystLoadingMgCm2?: number | null;
  /** precious metals in the catalyst; empty for a PGM-free electrode */
  metals: readonly MetalContent[];
}

export interface ElectrodeMetalLoading {
  electrode: string;
  catalystLoadingMgCm2: number | null;
  metals: { metal: string; contentWtPct: number | null; loadingMgCm2: number }[];
  /** all precious metal on this electrode, mg/cm² */
  metalLoadingMgCm2: number;
}

export interface MetalLoadingResult {
  electrodes: ElectrodeMetalLoading[];
  /** precious-metal loading per metal over all electrodes, mg/cm² */
  byMetal: Record<string, number>;
  /** all precious metal on the MEA, mg/cm² (per cm² of active area) */
  totalMgCm2: number;
  method: string;
}

/**
 * Precious-metal loading per electrode and in total.
 * Definition: metal loading (mg/cm²) = catalyst loading (mg/cm²) × metal content (wt %) / 100, per
 * metal, or the metal loading as recorded; an electrode's loading is the sum over its metals, the
 * MEA's total the sum over its electrodes (each per cm² of the same active area).
 * Reference: mass balance (hand-worked: 1.0 mg/cm² of a 40 wt % Pt catalyst holds 0.4 mg Pt/cm²).
 * Cost: O(electrodes × metals).
 * @throws RangeError when electrodes is not an array, an electrode label is empty or repeated, a
 *   loading is negative or not finite, a content is outside (0, 100] wt %, a metal gives both or
 *   neither of content and loading, a content is given without the catalyst loading, or one
 *   electrode's contents add up to more than 100 wt %.
 * @example preciousMetalLoading([{ electrode: 'cathode', catalystLoadingMgCm2: 1, metals: [{ metal: 'Pt', contentWtPct: 40 }] }]).totalMgCm2 // 0.4
 */
export function preciousMetalLoading(electrodes: readonly ElectrodeLoading[]): MetalLoadingResult {
  if (!Array.isArray(electrodes)) throw new RangeError('preciousMetalLoading: electrodes must be an array');
  const seen = new Set<string>();
  const byMetal: Record<string, number> = {};
  const result: ElectrodeMetalLoading[] = [];
  let total = 0;
  electrodes.forEach((entry, index) => {
    if (entry === null || typeof entry !== 'object') throw new RangeError(`preciousMetalLoading: electrode ${index} must be an object`);
    const label = typeof entry.electrode === 'string' ? entry.electrode.trim() : '';
    if (label === '') throw new RangeError(`preciousMetalLoading: electrode ${index} needs a label (e.g. anode, cathode)`);
    if (seen.has(label)) throw new RangeError(`preciousMetalLoading: electrode "${label}" is listed twice`);
    seen.add(label);
    const catalyst = entry.catalystLoadingMgCm2 ?? null;
    if (catalyst !== null && !(Number.isFinite(catalyst) && catalyst >= 0)) {
      throw new RangeError(`preciousMetalLoading: ${label}: catalystLoadingMgCm2 must be a number ≥ 0 mg/cm², got ${catalyst}`);
    }
    if (!Array.isArray(entry.metals)) throw new RangeError(`preciousMetalLoading: ${label}: metals must be an array (empty for a PGM-free electrode)`);
    let contentSum = 0;
    let electrodeTotal = 0;
    const metals: ElectrodeMetalLoading['metals'] = [];
    const metalNames = new Set<string>();
    (entry.metals as readonly MetalContent[]).forEach((metal: MetalContent, metalIndex: number) => {
      const name = metal && typeof metal.metal === 'string' ? metal.metal.trim() : '';
      if (name === '') throw new RangeError(`preciousMetalLoading: ${label}: metal ${metalIndex} needs a name`);
      if (metalNames.has(name)) throw new RangeError(`preciousMetalLoading: ${label}: metal ${name} is listed twice`);
      metalNames.add(name);
      const hasContent = metal.contentWtPct !== undefined && metal.contentWtPct !== null;
      const hasLoading = metal.loadingMgCm2 !== undefined && metal.loadingMgCm2 !== null;
      if (hasContent === hasLoading) throw new RangeError(`preciousMetalLoading: ${label}: ${name}: give either contentWtPct or loadingMgCm2, not ${hasContent ? 'both' : 'neither'}`);
      let loading: number;
      let content: number | null = null;
      if (hasContent) {
        content = metal.contentWtPct as number;
        if (!(Number.isFinite(content) && content > 0 && content <= 100)) throw new RangeError(`preciousMetalLoading: ${label}: ${name}: contentWtPct must be in (0, 100] wt %, got ${content}`);
        if (catalyst === null) throw new RangeError(`preciousMetalLoading: ${label}: ${name} is given by content, so the catalyst loading (mg/cm²) is needed`);
        contentSum += content;
        loading = (catalyst * content) / 100;
      } else {
        loading = metal.loadingMgCm2 as number;
        if (!(Number.isFinite(loading) && loading >= 0)) throw new RangeError(`preciousMetalLoading: ${label}: ${name}: loadingMgCm2 must be a number ≥ 0, got ${loading}`);
        if (catalyst !== null && loading > catalyst * (1 + 1e-9)) throw new RangeError(`preciousMetalLoading: ${label}: ${name}: ${loading} mg/cm² of metal exceeds the catalyst loading ${catalyst} mg/cm²`);
      }
      metals.push({ metal: name, contentWtPct: content, loadingMgCm2: loading });
      electrodeTotal += loading;
      byMetal[name] = (byMetal[name] ?? 0) + loading;
    });
    if (contentSum > 100 + 1e-9) throw new RangeError(`preciousMetalLoading: ${label}: the metal contents add up to ${contentSum} wt %, more than 100`);
    result.push({ electrode: label, catalystLoadingMgCm2: catalyst, metals, metalLoadingMgCm2: electrodeTotal });
    total += electrodeTotal;
  });
  return {
    electrodes: result,
    byMetal,
    totalMgCm2: total,
    method: 'metal loading = catalyst loading × metal content (wt %) / 100 per metal (or as recorded), summed per electrode and over the electrodes; mg/cm² of active area',
  };
}
