import type { CoreShape } from './core-shape.js';

const MM = 1e-3;

function e(designation: string, a: number, b: number, c: number, d: number, ee: number, f: number) {
  return {
    family: 'e',
    designation,
    overallWidthM: a * MM,
    halfHeightM: b * MM,
    depthM: c * MM,
    halfWindowHeightM: d * MM,
    windowSpanM: ee * MM,
    centreLegWidthM: f * MM,
  } as const satisfies CoreShape;
}

function etd(
  designation: string,
  a: number,
  b: number,
  c: number,
  d: number,
  ee: number,
  f: number,
) {
  return {
    family: 'etd',
    designation,
    overallWidthM: a * MM,
    halfHeightM: b * MM,
    depthM: c * MM,
    halfWindowHeightM: d * MM,
    windowSpanM: ee * MM,
    centreLegDiameterM: f * MM,
  } as const satisfies CoreShape;
}

function efd(
  designation: string,
  a: number,
  b: number,
  c: number,
  d: number,
  ee: number,
  f: number,
  k: number,
) {
  return { ...e(designation, a, b, c, d, ee, f), family: 'efd', centreLegDepthM: k * MM } as const;
}

function eq(
  designation: string,
  a: number,
  b: number,
  c: number,
  d: number,
  ee: number,
  f: number,
) {
  return { ...etd(designation, a, b, c, d, ee, f), family: 'eq' } as const;
}

function pq(
  designation: string,
  a: number,
  b: number,
  c: number,
  d: number,
  ee: number,
  f: number,
  g: number,
) {
  return {
    ...etd(designation, a, b, c, d, ee, f),
    family: 'pq',
    slotWidthM: g * MM,
  } as const satisfies CoreShape;
}

function ring(designation: string, outer: number, inner: number, height: number) {
  return {
    family: 'ring',
    designation,
    outerDiameterM: outer * MM,
    innerDiameterM: inner * MM,
    heightM: height * MM,
  } as const satisfies CoreShape;
}

/**
 * Standard core shapes by size designation, roughly 5 W (E 20, R 12.5, PQ 20/16) to 1 kW (E 65,
 * ETD 59, PQ 50/50) at 100 kHz. Dimensions are nominal, recalled from the IEC 62317 / IEC 63093
 * families (from memory): confirm every dimension against your supplier's drawing before
 * building. Letters as in {@link CoreShape} (A, B per half, C, D per half, E, F; EFD also K, the
 * centre-leg depth; PQ also G, the wire exit between the outer legs; for EQ and PQ, E is the
 * diameter of the winding space). Only sizes whose recalled dimensions reproduce the recalled
 * published le, Ae and Ve within a few percent are listed (the tests say which): PQ 32/20 to
 * PQ 40/40 and further EQ sizes are left out until their dimensions are confirmed, and RM cores
 * until their outer-leg outline and sections are.
 */
export const CORE_SHAPE_CATALOG: readonly CoreShape[] = [
  //  designation      A     B     C     D     E     F
  e('E 20/10/6', 20.0, 10.0, 5.9, 6.3, 12.8, 5.2),
  e('E 25/13/7', 25.0, 12.8, 7.5, 8.7, 17.5, 7.5),
  e('E 30/15/7', 30.0, 15.2, 7.3, 9.7, 19.5, 7.2),
  e('E 42/21/15', 42.0, 21.0, 15.2, 14.8, 29.5, 12.2),
  e('E 55/28/21', 55.0, 27.6, 21.0, 18.5, 37.5, 17.2),
  e('E 65/32/27', 65.0, 32.5, 27.0, 22.2, 44.2, 20.0),
  etd('ETD 29', 30.6, 15.8, 9.8, 11.0, 22.0, 9.8),
  etd('ETD 34', 35.0, 17.3, 11.1, 11.8, 25.6, 11.1),
  etd('ETD 39', 40.0, 19.8, 12.8, 14.2, 29.3, 12.8),
  etd('ETD 44', 45.0, 22.3, 15.2, 16.1, 32.5, 15.2),
  etd('ETD 49', 49.8, 24.7, 16.7, 17.7, 36.1, 16.7),
  etd('ETD 59', 59.8, 31.0, 21.7, 22.5, 44.7, 21.7),
  //  designation        A     B     C     D     E     F     K
  efd('EFD 20/10/7', 20.0, 10.0, 6.65, 7.7, 15.4, 8.9, 3.6),
  efd('EFD 25/13/9', 25.0, 12.5, 9.1, 9.35, 18.7, 11.4, 5.2),
  efd('EFD 30/15/9', 30.0, 15.0, 9.1, 11.2, 22.4, 14.6, 4.9),
  //  designation        A     B     C     D     E     F
  eq('EQ 30/8/20', 30.0, 8.0, 20.0, 5.3, 26.0, 11.0),
  //  designation       A     B       C     D      E     F      G
  pq('PQ 20/16', 20.5, 8.1, 14.0, 5.15, 18.0, 8.8, 12.0),
  pq('PQ 20/20', 20.5, 10.1, 14.0, 7.15, 18.0, 8.8, 12.0),
  pq('PQ 26/20', 26.5, 10.075, 19.0, 5.75, 22.5, 12.0, 15.5),
  pq('PQ 26/25', 26.5, 12.35, 19.0, 8.05, 22.5, 12.0, 15.5),
  pq('PQ 50/50', 50.0, 25.0, 32.0, 18.05, 44.0, 20.0, 32.0),
  //   designation      OD    ID   height
  ring('R 12.5/7.5/5', 12.5, 7.5, 5.0),
  ring('R 20/10/7', 20.0, 10.0, 7.0),
  ring('R 25/15/10', 25.0, 15.0, 10.0),
  ring('R 36/23/15', 36.0, 23.0, 15.0),
  ring('R 40/24/16', 40.0, 24.0, 16.0),
];
