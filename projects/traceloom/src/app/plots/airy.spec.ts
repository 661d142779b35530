import { airyAi, airyLogZ, logAiryAi } from './airy';

describe('float64 Airy function for the fitted curve', () => {
  it('matches published and independent values across the series and asymptotic ranges', () => {
    const table: [number, number, string][] = [
      [0, 0.3550280538878172, 'DLMF 9.2.3: 1/(3^(2/3) Gamma(2/3))'],
      [1, 0.1352924163128814, 'A&S Table 10.11'],
      [2, 0.03492413042327438, 'mpmath 1.3, independent'],
      [5, 1.083444281360744e-4, 'mpmath 1.3, independent'],
      [5.5, 3.36853119085998e-5, 'mpmath 1.3, independent (asymptotic side)'],
      [6, 9.94769436025289e-6, 'mpmath 1.3, independent'],
      [10, 1.104753255289869e-10, 'mpmath 1.3, independent'],
      [-1, 0.5355608832923521, 'mpmath 1.3, independent'],
      [-3, -0.378814293677658, 'mpmath 1.3, independent'],
      [-5, 0.3507610090241143, 'mpmath 1.3, independent'],
      [-7.5, 0.3217757163806479, 'mpmath 1.3, independent (oscillatory asymptotic side)'],
      [-10, 0.04024123848644319, 'mpmath 1.3, independent'],
    ];
    for (const [x, want, source] of table) {
      const rel = Math.abs(airyAi(x) - want) / Math.abs(want);
      expect(rel, `Ai(${x}), ${source}`).toBeLessThan(2e-8);
    }
  });

  it('gives ln Ai far beyond the float64 range of Ai itself', () => {
    // ln Ai(x), mpmath 1.3, independent (mp.dps = 30)
    const table: [number, number][] = [
      [1, -2.000316796278882],
      [20, -61.64407960837703],
      [100, -669.0835754253096],
      [1000, -21084.843522026387],
    ];
    for (const [x, want] of table) expect(logAiryAi(x)).toBeCloseTo(want, 7);
    expect(logAiryAi(-3)).toBeNaN();
  });

  it('evaluates the Fermi-gas form ln Z(N) = ln C^(-1/3) + A + ln Ai(C^(-1/3)(N - B))', () => {
    // C = 1 and B = 0 reduce it to A + ln Ai(N): A = 0.5 at N = 1 gives 0.5 - 2.000316796278882.
    const fit = { C: { value: 1 }, B: { value: 0 }, A: { value: 0.5 } };
    expect(airyLogZ(fit, 1)).toBeCloseTo(0.5 - 2.000316796278882, 12);
    // C = 8: C^(-1/3) = 1/2; N = 2, B = 0: ln(1/2) + ln Ai(1)
    const eight = { C: { value: 8 }, B: { value: 0 }, A: { value: 0 } };
    expect(airyLogZ(eight, 2)).toBeCloseTo(Math.log(0.5) - 2.000316796278882, 12);
  });
});
