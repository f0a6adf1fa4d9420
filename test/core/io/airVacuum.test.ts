import { describe, expect, it } from 'vitest';
import { airToVacuumA, refractiveIndexAir, vacuumToAirA } from '../../../src/core/io/airVacuum';

/**
 * Check pairs from reference.md sec. 2: Morton 2000 (ApJS 130, 403) values computed
 * with numpy; the Kr line and the 2000 A pair are IDL Astronomy User's Library
 * documentation examples (Ciddor 1996, which agrees with Morton to 2e-4 A there);
 * 4861.363 is the R port of the IDL airtovac example.
 */
const PAIRS: [air: number, vac: number, note: string][] = [
  [6562.8, 6564.613, 'H-alpha, Morton 2000 [C]'],
  [5006.84, 5008.237, '[O III], Morton 2000 [C]'],
  [4958.91, 4960.294, '[O III], Morton 2000 [C]'],
  [5889.95, 5891.582, 'Na D2, Morton 2000 [C]'],
  [5895.92, 5897.554, 'Na D1, Morton 2000 [C]'],
  [3726.03, 3727.09, '[O II], Morton 2000 [C]'],
  [6056.125, 6057.8019, 'Kr line, IDL airtovac documentation example'],
  [4861.363, 4862.721, 'R port of the IDL airtovac documentation example'],
];
const TOL_A = 1e-3;

describe('airToVacuumA(lambdaAirA)', () => {
  for (const [air, vac, note] of PAIRS) {
    it(`${air} A air -> ${vac} A vacuum (${note})`, () => {
      expect(Math.abs(airToVacuumA(air) - vac)).toBeLessThan(TOL_A);
    });
  }

  it('leaves wavelengths below 2000 A unchanged (IDL Astronomy User\'s Library convention)', () => {
    expect(airToVacuumA(1215.67)).toBe(1215.67);
    expect(airToVacuumA(1999.353)).toBe(1999.353);
  });

  it('agrees with the Piskunov inverse formula (used by VALD3, reference.md sec. 2) to 1e-4 A over 2000-25000 A', () => {
    const piskunov = (air: number): number => {
      const s2 = (1e4 / air) ** 2;
      const n = 1 + 8.336624212083e-5 + 2.408926869968e-2 / (130.1065924522 - s2) + 1.599740894897e-4 / (38.92568793293 - s2);
      return air * n;
    };
    for (let air = 2000; air <= 25000; air += 250) {
      expect(Math.abs(airToVacuumA(air) - piskunov(air))).toBeLessThan(1e-4);
    }
  });

  it('WCSLIB AWAV -> WAVE for 3800.0 A is 3801.0789 (reference.md sec. 2, astropy 5.2.1)', () => {
    expect(Math.abs(airToVacuumA(3800) - 3801.0789)).toBeLessThan(1e-3);
  });
});

describe('vacuumToAirA(lambdaVacA)', () => {
  for (const [air, vac, note] of PAIRS) {
    it(`${vac} A vacuum -> ${air} A air (${note})`, () => {
      expect(Math.abs(vacuumToAirA(vac) - air)).toBeLessThan(TOL_A);
    });
  }

  it('2000.000 A vacuum -> 1999.352 A air (IDL vactoair example 1999.353 with Ciddor; Morton gives 1999.3520)', () => {
    expect(Math.abs(vacuumToAirA(2000) - 1999.352)).toBeLessThan(TOL_A);
  });

  it('is the exact inverse of airToVacuumA wherever the air value is above 2000 A', () => {
    for (let vac = 2001; vac < 30000; vac += 997.3) {
      expect(Math.abs(airToVacuumA(vacuumToAirA(vac)) - vac)).toBeLessThan(1e-8);
    }
  });

  it('n - 1 at 6564.61 A is 2.76251e-4 (reference.md sec. 2, Morton 2000 [C])', () => {
    expect(refractiveIndexAir(6564.61) - 1).toBeCloseTo(2.76251e-4, 9);
  });

  it('passes NaN through', () => {
    expect(vacuumToAirA(NaN)).toBeNaN();
    expect(airToVacuumA(NaN)).toBeNaN();
  });
});
