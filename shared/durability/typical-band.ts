// Degradation rates the trade calls typical, for the UI's comparison band and for test checks.

/**
 * Typical voltage degradation rates of HT-PEM single cells at constant current near 0.2 A/cm², µV/h
 * (positive = losing voltage): a standard assembly loses 10–15 µV/h, an improved one about 5 µV/h.
 * Reference: common practice in the trade (no single source).
 */
export const TYPICAL_DEGRADATION_BAND = { standard: [10, 15], improved: 5 } as const;
