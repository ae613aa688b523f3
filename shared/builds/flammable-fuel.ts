// Which gas or fuel names are flammable, for the cautions the plan, proposal and build forms show
// (hydrogen, alcohol and ether vapours, reformate, CO, methane). One list for server and client.

/** Names (and the usual short forms) of the flammable fuels a fuel-cell test may run on, lower case. */
export const FLAMMABLE_FUELS = ['h2', 'hydrogen', 'reformate', 'methanol', 'meoh', 'ethanol', 'etoh', 'dme', 'dimethyl', 'co', 'ch4', 'methane', 'fuel'] as const;

const PATTERN = new RegExp(`(?:^|[^a-z0-9])(?:${FLAMMABLE_FUELS.map((name) => name.replace(/ /g, '\\s+')).join('|')})(?![a-z0-9])`, 'i');

/**
 * Whether a gas or fuel as written names a flammable fuel: any of FLAMMABLE_FUELS as a whole word,
 * so "5 % H2 in N2" and "Hydrogen" are, "air", "N2", "H2O" and "CO2" are not.
 * Cost: O(length).
 * @throws never.
 * @example isFlammableFuel('H2/N2') // true
 */
export function isFlammableFuel(text: string | null | undefined): boolean {
  return PATTERN.test(text ?? '');
}
