import { describe, expect, it } from 'vitest';
import { GYR_S, hubbleDistanceMpc, hubbleTimeGyr, MPC_KM, SPEED_OF_LIGHT_KMS } from '../../../src/core/cosmology/constants';
import { HUBBLE_70 } from './referenceValues';

describe('constants', () => {
  it('c, Mpc and Gyr as in docs/reference.md sec. 4 (SI exact c; IAU 2015 pc; Julian year)', () => {
    expect(SPEED_OF_LIGHT_KMS).toBe(299792.458);
    // 1 pc = 648000/pi au, au = 149597870.7 km (IAU 2012 B2, IAU 2015 B2)
    expect(Math.abs(MPC_KM / ((1e6 * 648000 * 149597870.7) / Math.PI) - 1)).toBeLessThan(1e-15);
    expect(GYR_S).toBe(1e9 * 365.25 * 86400);
  });
  it('hubbleTimeGyr(70) = 13.968460 and hubbleDistanceMpc(70) = 4282.7494 (docs/reference.md sec. 4 [C])', () => {
    expect(Math.abs(hubbleTimeGyr(70) - HUBBLE_70.timeGyr)).toBeLessThan(5e-7);
    expect(Math.abs(hubbleDistanceMpc(70) - HUBBLE_70.distanceMpc)).toBeLessThan(5e-5);
  });
});
