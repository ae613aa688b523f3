import { describe, expect, it } from 'vitest';
import { isFlammableFuel } from '../../../shared/builds/flammable-fuel';

// Which test gases burn: common practice in the trade (hydrogen, reformate, alcohol and ether vapours, CO, methane).
describe('isFlammableFuel', () => {
  it('flags the fuels however they are written', () => {
    for (const gas of ['H2', 'hydrogen', 'Pure H2', '5 % H2 in N2', 'H2/N2', 'reformate (H2/CO2/CO)', 'Methanol', 'MeOH vapour', 'DME', 'dimethyl ether', 'CO', 'CH4', 'ethanol']) expect(isFlammableFuel(gas), gas).toBe(true);
  });
  it('leaves oxidants and inert gases alone', () => {
    for (const gas of ['air', 'synthetic air', 'O2', 'oxygen', 'N2', 'nitrogen', 'Ar', 'He', 'CO2', 'H2O', '', null, undefined]) expect(isFlammableFuel(gas), String(gas)).toBe(false);
  });
});
