/**
 * The leakage the push-pull's light-load event ring takes (`RingCircuit.leakageH`, on the primary:
 * the caller refers it to the secondary), H: the drains' differential mode, Llk/2, or none.
 *
 * Each drain sits behind its half's leakage Llk, with its capacitance C to ground. Where no
 * drain's diode conducts (body diode at zero, clamp at Vin + Vc) the two halves are alike, so the
 * drains' motion splits into two modes that do not meet: the differential, (vb − va)/2 with the
 * current ia − ib, which the transformer carries (the winding's voltage plus the leakages' half
 * of their drop: Llk/2 on the 2·C node the lumped ring already has), and the common mode,
 * (va + vb)/2 − Vin with ia + ib, which the transformer does not see and which rings with Llk and
 * C alone about the rail. So the lumped ring with Llk/2 between the winding and its node is the
 * circuit's differential mode, exactly: at the winding's zero crossing after the turn-off the
 * leakages carry the primary current on while the rectifiers hand the output's current over
 * (both conducting, the winding at zero), the drains' difference rising by that current on
 * √(Llk/C) (the `off` stretch of `simulateRing`), and the slow ring of the inductances with the
 * drains starts from there, not from the winding's zero. Without it the ring started lower with
 * as much current, reached the body diode's clamp with more, and held it longer: the seed-59
 * scan's push-pull 11 (36 V, 0.2 µH, 100 pF, 6.5 % load) read its drain at 2·Vin for 178 ns
 * after the turn-off's ring against ngspice's some 140, so the drain the other switch turns on
 * beside stood 6.5 V lower and the turn-on ring's peak 9.5 % higher (DEVELOPERS.md, "The
 * push-pull's off-time with its leakage").
 *
 * The common mode starts at the turn-off with the switch's current I0 in one leakage and none in
 * the other, so each drain swings I0·√(Llk/C)/2 about its differential motion. Where that reaches
 * Vin the far drain comes back to its body diode while the differential ring runs (ngspice:
 * seed 37's push-pull 15 at 18 V, 1.7 A, 0.2 µH, 100 pF: a 39 V swing, the far drain on its
 * diode again and again for some 200 ns), the two modes exchange current there, and neither the
 * differential ring nor the ring without leakage follows the circuit; the latter is kept there,
 * as before (undefined). ref: the modes of two equal coupled LC halves (common practice:
 * superposition of the symmetric and antisymmetric modes of a symmetric linear network); the
 * push-pull's own circuit equations, as `push-pull-leaky-half.ts` takes them; checked against
 * ngspice (Debian) in `push-pull-off-time-leakage-netlist.test.ts`.
 */
export function pushPullRingLeakageH(v: {
  /** Each half's leakage, H. */
  leakageH: number;
  /** One switch's drain capacitance, F. */
  switchCapacitanceF: number;
  /** The switch's current as it turns off, A. */
  turnOffA: number;
  inputV: number;
}): number | undefined {
  const { leakageH: llk, switchCapacitanceF: c } = v;
  if (!(llk > 0 && c > 0)) return undefined;
  const commonSwingV = (v.turnOffA * Math.sqrt(llk / c)) / 2;
  return commonSwingV < v.inputV ? llk / 2 : undefined;
}
