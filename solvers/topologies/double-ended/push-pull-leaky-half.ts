import { solveLinear } from '../../root-finding/linear-unknowns.js';

/**
 * The push-pull's light-load half with its leakage in the ring (issue 3; DEVELOPERS.md, "The
 * push-pull's turn-on ring" and "The push-pull's leaky light-load half"). The lumped event model
 * (`event-half.ts`) puts the push-pull's 2·Coss straight across the winding; in the circuit each
 * drain sits behind its half's leakage Llk, so the off drain rings with 2·Llk about 2·Vin during
 * the on-time and both drains ring with the leakages after it, and what the turn-off hands the
 * output depends on that ring's phase. Here, on the primary, in the frame of the half driven
 * (switch a on from the half's start for D·T):
 *  - ia, ib: the leakage currents from the rail into each half (rail → leakage → half winding →
 *    drain); va, vb: the drains, each with its switch's capacitance C to ground, pinned at zero
 *    while its switch is on, held by its body diode at zero and by the clamp at Vin + Vc (an ideal
 *    level above the rail) while off; each half's loop resistance in series with its leakage;
 *  - an ideal transformer with Lm across half a (the half winding's voltage e, the magnetizing
 *    current Im) and a center-tapped secondary with ideal rectifiers into the output inductor L
 *    (IL) and the held output: the conducting path's voltage Vo + its drops (affine in IL), the
 *    freewheel's likewise (both rectifiers share IL, e = 0);
 *  - the winding voltage from the transformer's currents: ia − ib = Im + IL/n while rectifier a
 *    conducts (−IL/n for b), Im alone while none does.
 * In every stretch between events (a drain reaching zero or the clamp or leaving it, a rectifier
 * starting or stopping, the gate's turn-off) the circuit is linear with constant sources, so each
 * stretch is solved exactly: x(t) = e^{At}·x0 + ∫e^{As}ds·b, the matrix exponential of the
 * stretch's system (scaling and squaring of its Taylor series), stepped at a fixed fraction of the
 * leakage's ring period to find the events' sign changes and each event's time by bisection of the
 * exact solution. The mean inductor current and the clamp's charge are integrated with the state.
 * The half is periodic when its end, mirrored (a ↔ b, Im → −Im), is its start, the drain of the
 * switch turning on pinned at zero (its charge discharged by the switch, as the hard-switched
 * turn-on does): five unknowns (ia, ib, vb, IL, Im at the turn-on) and, with the output held, the
 * duty cycle from charge balance (the mean IL the load), by Newton's method with forward
 * differences. Undamped, as `event-half.ts`: the clamp and the output take the energy.
 * ref: the circuit's own equations (as the time-stepped `test/bench/push-pull-leakage-reference.ts`,
 * which ngspice follows within 1–1.8 % at a held clamp); the matrix exponential by scaling and
 * squaring (Moler & Van Loan, "Nineteen dubious ways to compute the exponential of a matrix",
 * 1978/2003, from memory), common practice; Newton's method for a periodic orbit (shooting),
 * common practice; Erickson & Maksimović, 2nd ed. (from memory), §2.3 (charge balance).
 */

/** The circuit of {@link solvePushPullLeakyHalf} (SI units, primary side but IL). */
export interface PushPullLeakyCircuit {
  inputV: number;
  /** Each half's leakage, H. */
  leakageH: number;
  /** Each half's loop resistance (switch, winding half), in series with its leakage, Ω. */
  halfResistanceOhm: number;
  /** One switch's drain capacitance, F. */
  capacitanceF: number;
  /** Across half a, H. */
  magnetizingH: number;
  /** Primary half turns over secondary half turns. */
  turnsRatio: number;
  inductanceH: number;
  halfS: number;
  /** The clamp's level above the rail, V (Infinity: no clamp). */
  clampV: number;
  /** The conducting path's voltage at zero current (Vo + Vf) and its resistance. */
  pathV: number;
  pathOhm: number;
  /** The freewheel's voltage at zero current and its resistance (IL shared by both rectifiers). */
  freewheelV: number;
  freewheelOhm: number;
  /**
   * The outputs after the first (none: one output), each with its own inductor current and its
   * voltage a state held over the half (an unknown of the periodic half, from its charge balance).
   */
  others?: readonly PushPullLeakyOutput[];
}

/**
 * An output after the first (`PushPullLeakyCircuit.others`): its voltage is not held at a
 * target but follows from its charge balance (its mean inductor current its load), as the
 * lumped several-output model takes the cross-regulated outputs.
 */
export interface PushPullLeakyOutput {
  /** Primary half turns over this output's secondary half turns. */
  turnsRatio: number;
  inductanceH: number;
  /** The conducting path's drop at zero current (the rectifier's), V, and its resistance, Ω. */
  pathDropV: number;
  pathOhm: number;
  /** The freewheel's drop at zero current, V, and its resistance (IL shared), Ω. */
  freewheelDropV: number;
  freewheelOhm: number;
  /** The load's current, A. */
  loadA: number;
  /** Where the solve from rest starts the output's voltage, V. */
  voltageGuessV: number;
}

type Rectifier = 'a' | 'b' | 'freewheel' | 'off';
/** An off drain: free, held at zero by its body diode, or at the clamp. */
type Drain = 'free' | 'low' | 'high' | 'on';

/**
 * ia, ib, va, vb, IL, Im, ∫IL dt, ∫(clamp current) dt; then for each output after the first its
 * inductor current, ∫ of it dt and its voltage (`otherAt`).
 */
const N1 = 8;
const IA = 0;
const IB = 1;
const VA = 2;
const VB = 3;
const IL = 4;
const IM = 5;
const Q = 6;
const QC = 7;

/** Places of the other output `j` (1 for the second output) in the state. */
function otherAt(j: number): { il: number; q: number; v: number } {
  const base = N1 + 3 * (j - 1);
  return { il: base, q: base + 1, v: base + 2 };
}

/**
 * The rectifiers' state: conducting on side a or b (the outputs in `mask` conducting, the others
 * off: a conducting output holds the winding to its path voltage, so all that conduct share one
 * side), freewheeling (the outputs in `mask`, both rectifiers of each on, holding the winding at
 * zero) or off (`mask` 0, the winding free). Bit j of `mask` is output j (0 the first).
 */
interface Mode {
  rect: Rectifier;
  mask: number;
  a: Drain;
  b: Drain;
}

/** The stretch's constant: the augmented matrix [[A, b], [0, 0]] (by rows), and a cache. */
interface Stretch {
  m: Float64Array;
  /** M's first N rows without their zeros (`sparseRows`). */
  mRows: SparseRows;
  /** e^{M·h} at the standard step, its first N rows without their zeros. */
  step?: SparseRows;
  /**
   * What a step reads at its end from [x; 1], by rows: the state's rate (M's first N rows), the
   * guards (`guards`, affine in the state) and their rates (the guards' linear part times M).
   */
  reads: Float64Array;
  /** `reads` without its zeros. */
  readsRows: SparseRows;
}

/**
 * Rows of an augmented matrix (AUG wide, by rows) without their zero entries: each row's
 * constant (its last column) and its nonzero coefficients with their columns, in column order.
 * A row times [x; 1] summed over these alone is the dense sum to the last bit for a finite x
 * (a zero coefficient adds a zero; at most the sign of a zero result can differ), at a fraction
 * of the work: most of a stretch's rows are sparse (a guard reads one or two places).
 */
interface SparseRows {
  constants: Float64Array;
  starts: Int32Array;
  columns: Int32Array;
  values: Float64Array;
}

function sparseRows(matrix: Float64Array, rows: number, N: number): SparseRows {
  const AUG = N + 1;
  const constants = new Float64Array(rows);
  const starts = new Int32Array(rows + 1);
  const columns: number[] = [];
  const values: number[] = [];
  for (let i = 0; i < rows; i++) {
    constants[i] = matrix[i * AUG + N] as number;
    for (let j = 0; j < N; j++) {
      const v = matrix[i * AUG + j] as number;
      if (v !== 0) {
        columns.push(j);
        values.push(v);
      }
    }
    starts[i + 1] = columns.length;
  }
  return {
    constants,
    starts,
    columns: Int32Array.from(columns),
    values: Float64Array.from(values),
  };
}

/**
 * out = the rows of `s` times [x; 1] (the constant taken where `withConstant`, else zero first,
 * as the dense loops sum).
 */
function sparseAffine(
  s: SparseRows,
  x: Float64Array,
  out: Float64Array,
  rows: number,
  withConstant = true,
): void {
  const { constants, starts, columns, values } = s;
  for (let i = 0; i < rows; i++) {
    let v = withConstant ? (constants[i] as number) : 0;
    const end = starts[i + 1] as number;
    for (let p = starts[i] as number; p < end; p++) {
      v += (values[p] as number) * (x[columns[p] as number] as number);
    }
    out[i] = v;
  }
}

/**
 * The winding voltage of half a in `rect` with the outputs of `mask` conducting (`Mode`) as an
 * affine function of the state: coefficients and constant (`N + 1` long, N the state's size).
 */
function windingRow(
  k: PushPullLeakyCircuit,
  rect: Rectifier,
  mask: number,
  N: number,
): Float64Array {
  const row = new Float64Array(N + 1);
  const n = k.turnsRatio;
  const llk = k.leakageH;
  const r = k.halfResistanceOhm;
  const others = k.others ?? [];
  if (rect === 'freewheel') return row;
  // The winding from the transformer's currents, d(ia − ib)/dt = dIm/dt (± Σ dIL_j/dt/n_j over
  // the conducting outputs): e·(2/Llk + 1/Lm [+ Σ 1/(n_j²·L_j)]) = (vb − va − r·(ia − ib))/Llk
  // [± Σ (pathV_j + R_j·IL_j)/(n_j·L_j)].
  let sum = 2 / llk + 1 / k.magnetizingH;
  if (rect !== 'off') {
    if ((mask & 1) !== 0) sum += 1 / (n * n * k.inductanceH);
    for (let j = 1; j <= others.length; j++) {
      const o = others[j - 1] as PushPullLeakyOutput;
      if ((mask & (1 << j)) !== 0) sum += 1 / (o.turnsRatio * o.turnsRatio * o.inductanceH);
    }
  }
  row[VB] = 1 / llk / sum;
  row[VA] = -1 / llk / sum;
  row[IA] = -r / llk / sum;
  row[IB] = r / llk / sum;
  if (rect === 'a' || rect === 'b') {
    const sign = rect === 'a' ? 1 : -1;
    // + sign·(pathV + R·IL)/(n·L)
    if ((mask & 1) !== 0) {
      row[N] = (sign * k.pathV) / (n * k.inductanceH) / sum;
      row[IL] = (sign * k.pathOhm) / (n * k.inductanceH) / sum;
    }
    // The other outputs': their voltage a state, pathV_j = V_j + its drop.
    for (let j = 1; j <= others.length; j++) {
      const o = others[j - 1] as PushPullLeakyOutput;
      if ((mask & (1 << j)) === 0) continue;
      const at = otherAt(j);
      const nl = o.turnsRatio * o.inductanceH;
      row[N] = (row[N] as number) + (sign * o.pathDropV) / nl / sum;
      row[at.v] = (row[at.v] as number) + sign / nl / sum;
      row[at.il] = (row[at.il] as number) + (sign * o.pathOhm) / nl / sum;
    }
  }
  return row;
}

function stretchOf(w: Work, mode: Mode): Stretch {
  const k = w.k;
  const { n: N, aug: AUG, guardCount: GUARDS, readCount: READS } = w;
  const m = new Float64Array(AUG * AUG);
  const e = windingRowFor(w, mode.rect, mode.mask);
  const llk = k.leakageH;
  const r = k.halfResistanceOhm;
  const set = (i: number, j: number, v: number) => {
    m[i * AUG + j] = (m[i * AUG + j] as number) + v;
  };
  // dia/dt = (Vin − va − e − r·ia)/Llk, dib/dt = (Vin − vb + e − r·ib)/Llk.
  set(IA, N, k.inputV / llk);
  set(IA, VA, -1 / llk);
  set(IA, IA, -r / llk);
  set(IB, N, k.inputV / llk);
  set(IB, VB, -1 / llk);
  set(IB, IB, -r / llk);
  for (let j = 0; j < AUG; j++) {
    set(IA, j, -(e[j] as number) / llk);
    set(IB, j, (e[j] as number) / llk);
    set(IM, j, (e[j] as number) / k.magnetizingH);
  }
  if (mode.a === 'free') set(VA, IA, 1 / k.capacitanceF);
  if (mode.b === 'free') set(VB, IB, 1 / k.capacitanceF);
  const n = k.turnsRatio;
  const l = k.inductanceH;
  const isFirst = (mode.mask & 1) !== 0;
  if ((mode.rect === 'a' || mode.rect === 'b') && isFirst) {
    const sign = mode.rect === 'a' ? 1 : -1;
    for (let j = 0; j < AUG; j++) set(IL, j, (sign * (e[j] as number)) / (n * l));
    set(IL, N, -k.pathV / l);
    set(IL, IL, -k.pathOhm / l);
  } else if (mode.rect === 'freewheel' && isFirst) {
    set(IL, N, -k.freewheelV / l);
    set(IL, IL, -k.freewheelOhm / l);
  }
  set(Q, IL, 1);
  // The other outputs: L_j·dIL_j/dt = ±e/n_j − (V_j + drop_j) − R_j·IL_j while conducting,
  // −(V_j + drop_j) − R_j·IL_j while freewheeling; V_j held (no row).
  const others = k.others ?? [];
  for (let j = 1; j <= others.length; j++) {
    const o = others[j - 1] as PushPullLeakyOutput;
    const at = otherAt(j);
    const lj = o.inductanceH;
    if ((mode.mask & (1 << j)) !== 0) {
      if (mode.rect === 'a' || mode.rect === 'b') {
        const sign = mode.rect === 'a' ? 1 : -1;
        for (let c = 0; c < AUG; c++)
          set(at.il, c, (sign * (e[c] as number)) / (o.turnsRatio * lj));
        set(at.il, N, -o.pathDropV / lj);
        set(at.il, at.v, -1 / lj);
        set(at.il, at.il, -o.pathOhm / lj);
      } else if (mode.rect === 'freewheel') {
        set(at.il, N, -o.freewheelDropV / lj);
        set(at.il, at.v, -1 / lj);
        set(at.il, at.il, -o.freewheelOhm / lj);
      }
    }
    set(at.q, at.il, 1);
  }
  if (mode.a === 'high') set(QC, IA, 1);
  if (mode.b === 'high') set(QC, IB, 1);
  // The guards as an affine map (their values at the unit states less at zero, and at zero),
  // and their rates: the linear part times M.
  const reads = new Float64Array(READS * AUG);
  const unit = new Float64Array(N);
  const atZero = guards(w, mode, unit, new Float64Array(GUARDS));
  const column = new Float64Array(GUARDS);
  const linear = new Float64Array(GUARDS * N);
  for (let j = 0; j < N; j++) {
    unit.fill(0);
    unit[j] = 1;
    guards(w, mode, unit, column, true);
    for (let g = 0; g < GUARDS; g++) linear[g * N + j] = column[g] as number;
  }
  for (let i = 0; i < N; i++) {
    for (let j = 0; j < AUG; j++) reads[i * AUG + j] = m[i * AUG + j] as number;
  }
  for (let g = 0; g < GUARDS; g++) {
    const row = (N + g) * AUG;
    const rateRow = (N + GUARDS + g) * AUG;
    for (let j = 0; j < N; j++) reads[row + j] = linear[g * N + j] as number;
    reads[row + N] = atZero[g] as number;
    for (let j = 0; j < AUG; j++) {
      let v = 0;
      for (let p = 0; p < N; p++) v += (linear[g * N + p] as number) * (m[p * AUG + j] as number);
      reads[rateRow + j] = v;
    }
  }
  return { m, mRows: sparseRows(m, N, N), reads, readsRows: sparseRows(reads, READS, N) };
}

function multiply(a: Float64Array, b: Float64Array, out: Float64Array, AUG: number): Float64Array {
  out.fill(0);
  for (let i = 0; i < AUG; i++) {
    for (let p = 0; p < AUG; p++) {
      const aip = a[i * AUG + p] as number;
      if (aip === 0) continue;
      for (let j = 0; j < AUG; j++) {
        out[i * AUG + j] = (out[i * AUG + j] as number) + aip * (b[p * AUG + j] as number);
      }
    }
  }
  return out;
}

/**
 * e^{M·t} by scaling and squaring: M·t/2^s scaled to a spectral size below a tenth (the ring's
 * ω·t, bounded by the Frobenius norm of the matrix in units where every state is of its own
 * scale would be tighter; the ring frequency `omega` bounds it here), 14 Taylor terms, s
 * squarings.
 */
function expm(m: Float64Array, t: number, omega: number, AUG: number): Float64Array {
  const s = Math.max(0, Math.ceil(Math.log2((omega * t) / 0.1)));
  const scale = t / 2 ** s;
  const term = new Float64Array(AUG * AUG);
  const sum = new Float64Array(AUG * AUG);
  let scratch = new Float64Array(AUG * AUG);
  for (let i = 0; i < AUG; i++) {
    term[i * AUG + i] = 1;
    sum[i * AUG + i] = 1;
  }
  let current = term;
  for (let order = 1; order <= 14; order++) {
    multiply(current, m, scratch, AUG);
    for (let i = 0; i < AUG * AUG; i++) scratch[i] = ((scratch[i] as number) * scale) / order;
    const next = scratch;
    scratch = current === term ? new Float64Array(AUG * AUG) : current;
    current = next;
    for (let i = 0; i < AUG * AUG; i++) sum[i] = (sum[i] as number) + (current[i] as number);
  }
  let result = sum;
  let other = new Float64Array(AUG * AUG);
  for (let i = 0; i < s; i++) {
    multiply(result, result, other, AUG);
    const t2 = result;
    result = other;
    other = t2;
  }
  return result;
}

/** The solver's constants for one circuit: the step and the stretches met so far. */
interface Work {
  k: PushPullLeakyCircuit;
  /** The outputs (1 + the others). */
  outputs: number;
  /** The state's size (`N1` + 3 a further output), the augmented size, the guards, the reads. */
  n: number;
  aug: number;
  guardCount: number;
  readCount: number;
  omega: number;
  stepS: number;
  /** Events in the half last run (a guard against chattering). */
  events: number;
  /** Scratch for the Taylor terms. */
  terms: Float64Array[];
  /** The winding voltage's rows (`windingRow`) by rectifier state and mask (`windingRowFor`). */
  rows: (Float64Array | undefined)[];
  /** The highest inductor current met in the half last run (at the steps and events), A. */
  peakInductorA: number;
  /** The same of each further output (index j − 1), A. */
  otherPeaksA: Float64Array;
  /** The state's places whose peaks the half tracks (`track`, `trackWithin`). */
  tracked: number[];
  /** The largest magnitude of the magnetizing current met there, A. */
  peakMagnetizingA: number;
  /** The highest drain voltage met in the half last run (either drain), V. */
  peakDrainV: number;
  /** Halves left to run (shared by the solves of one regulated search), or none. */
  budget?: LeakyBudget | undefined;
  /** The driven switch's highest current (its leakage's, ia) met while it is on, A. */
  peakSwitchA: number;
  isOn: boolean;
  /** Scratch for a step's reads (`Stretch.reads`) at its start and its end. */
  readsBefore: Reads;
  readsAfter: Reads;
  /** Scratch for a step's end, a probe within it, and one quantity's Taylor coefficients. */
  trial: Float64Array;
  probe: Float64Array;
  coefficients: Float64Array;
  /** The stretches met so far by rectifier and drains (`stretchFor`; none: not yet built). */
  byIndex: (Stretch | undefined)[];
}

/** A step's reads (`Stretch.reads`): one buffer and its parts. */
interface Reads {
  all: Float64Array;
  rate: Float64Array;
  guards: Float64Array;
  guardRates: Float64Array;
}

function readsOf(N: number, GUARDS: number): Reads {
  const READS = N + 2 * GUARDS;
  const all = new Float64Array(READS);
  return {
    all,
    rate: all.subarray(0, N),
    guards: all.subarray(N, N + GUARDS),
    guardRates: all.subarray(N + GUARDS, READS),
  };
}

/** Steps a period of the fastest ring (a guard or a tracked quantity turns at most once a step). */
const STEPS_PER_RING = 8;

function workOf(k: PushPullLeakyCircuit): Work {
  // The fastest ring: one leakage with one drain (the common mode), ω = 1/√(Llk·C).
  const omega = 1 / Math.sqrt(k.leakageH * k.capacitanceF);
  const others = k.others?.length ?? 0;
  const N = N1 + 3 * others;
  const GUARDS = GUARDS1 + 2 * others;
  const tracked = [IL, IM, IA, VA, VB];
  for (let j = 1; j <= others; j++) tracked.push(otherAt(j).il);
  return {
    k,
    outputs: 1 + others,
    n: N,
    aug: N + 1,
    guardCount: GUARDS,
    readCount: N + 2 * GUARDS,
    otherPeaksA: new Float64Array(others),
    tracked,
    omega,
    stepS: (2 * Math.PI) / omega / STEPS_PER_RING,
    events: 0,
    peakInductorA: 0,
    peakMagnetizingA: 0,
    peakSwitchA: 0,
    peakDrainV: 0,
    isOn: false,
    readsBefore: readsOf(N, GUARDS),
    readsAfter: readsOf(N, GUARDS),
    trial: new Float64Array(N),
    probe: new Float64Array(N),
    coefficients: new Float64Array(TERMS),
    byIndex: new Array<Stretch | undefined>(64 << others).fill(undefined),
    terms: Array.from({ length: TERMS }, () => new Float64Array(N)),
    rows: new Array<Float64Array | undefined>(4 << (1 + others)).fill(undefined),
  };
}

/** The winding's row (`windingRow`) of `rect` with the outputs of `mask` conducting, cached. */
function windingRowFor(w: Work, rect: Rectifier, mask: number): Float64Array {
  const index = (RECT_INDEX[rect] << w.outputs) + mask;
  let row = w.rows[index];
  if (row === undefined) {
    row = windingRow(w.k, rect, mask, w.n);
    w.rows[index] = row;
  }
  return row;
}

const RECT_INDEX: Record<Rectifier, number> = { a: 0, b: 1, freewheel: 2, off: 3 };
const DRAIN_INDEX: Record<Drain, number> = { free: 0, low: 1, high: 2, on: 3 };

function stretchFor(w: Work, mode: Mode): Stretch {
  const index =
    (((RECT_INDEX[mode.rect] << w.outputs) + mode.mask) << 4) +
    DRAIN_INDEX[mode.a] * 4 +
    DRAIN_INDEX[mode.b];
  let s = w.byIndex[index];
  if (s === undefined) {
    s = stretchOf(w, mode);
    w.byIndex[index] = s;
  }
  return s;
}

function windingV(w: Work, x: Float64Array, rect: Rectifier, mask: number, isRate = false): number {
  const row = windingRowFor(w, rect, mask);
  const N = w.n;
  let v = isRate ? 0 : (row[N] as number);
  for (let j = 0; j < N; j++) v += (row[j] as number) * (x[j] as number);
  return v;
}

/**
 * The event functions of `mode` at x: each changes sign where the mode ends (positive while it
 * holds). With `isRate`, x is the state's rate and out the functions' rates (their linear part;
 * every function is affine in the state). Unused places stay positive (rates zero), so they
 * never end the mode.
 */
function guards(
  w: Work,
  mode: Mode,
  x: Float64Array,
  out: Float64Array,
  isRate = false,
): Float64Array {
  for (let g = 0; g < w.guardCount; g++) out[g] = guardAt(w, mode, x, g, isRate);
  return out;
}

/** The guard count with one output (`guards`' length: 2 a drain, 3 the rectifiers). */
const GUARDS1 = 7;

/**
 * `guards(w, mode, x, …, isRate)[g]` alone (an event's series reads one guard's Taylor
 * coefficients, `TERMS` of them a crossing). Places 0–3 the drains (a free drain at zero or the
 * clamp, a held one's current reversing); 4–6 the rectifiers as one output's: while conducting
 * the winding reversing (into the freewheel) and the first output's current reaching zero (or,
 * where it does not conduct, its path voltage reached); while freewheeling the referred current
 * reaching the conducting outputs' summed currents either way (all commutate together: the
 * winding is held at zero until then) and the first's current reaching zero; with none, the
 * winding reaching the first's path voltage either way; then two places a further output j, as
 * the first's (its current, or its path voltage V_j + drop reached by the winding over n_j).
 */
function guardAt(w: Work, mode: Mode, x: Float64Array, g: number, isRate = false): number {
  const k = w.k;
  if (g < 4) {
    const drain = g < 2 ? mode.a : mode.b;
    const v = g < 2 ? VA : VB;
    const i = g < 2 ? IA : IB;
    const isFirst = g % 2 === 0;
    if (drain === 'free') {
      return isFirst ? (x[v] as number) : (isRate ? 0 : k.inputV + k.clampV) - (x[v] as number);
    }
    if (isFirst && drain === 'low') return -(x[i] as number);
    if (isFirst && drain === 'high') return x[i] as number;
    return isRate ? 0 : 1;
  }
  const idle = isRate ? 0 : 1;
  if (g < GUARDS1) {
    const n = k.turnsRatio;
    const il = x[IL] as number;
    const isMember = (mode.mask & 1) !== 0;
    const path = isRate ? 0 : k.pathV;
    if (mode.rect === 'a') {
      if (g === 4) return windingV(w, x, 'a', mode.mask, isRate);
      if (g === 5) return isMember ? il : path - windingV(w, x, 'a', mode.mask, isRate) / n;
    } else if (mode.rect === 'b') {
      if (g === 4) return -windingV(w, x, 'b', mode.mask, isRate);
      if (g === 5) return isMember ? il : path + windingV(w, x, 'b', mode.mask, isRate) / n;
    } else if (mode.rect === 'freewheel') {
      if (g === 6) return isMember ? il : idle;
      // The freewheeling outputs' currents referred to the first's secondary.
      let total = isMember ? il : 0;
      const others = k.others ?? [];
      for (let j = 1; j <= others.length; j++) {
        if ((mode.mask & (1 << j)) === 0) continue;
        const o = others[j - 1] as PushPullLeakyOutput;
        total += ((x[otherAt(j).il] as number) * n) / o.turnsRatio;
      }
      const referred = n * ((x[IA] as number) - (x[IB] as number) - (x[IM] as number));
      return g === 4 ? total - referred : total + referred;
    } else if (g !== 6) {
      const e = windingV(w, x, 'off', 0, isRate);
      return g === 4 ? path - e / n : path + e / n;
    }
    return idle;
  }
  // A further output j.
  const j = 1 + ((g - GUARDS1) >> 1);
  const slot = (g - GUARDS1) % 2;
  const o = (k.others ?? [])[j - 1] as PushPullLeakyOutput;
  const at = otherAt(j);
  if ((mode.mask & (1 << j)) !== 0) return slot === 0 ? (x[at.il] as number) : idle;
  if (mode.rect === 'freewheel') return idle;
  const path = (x[at.v] as number) + (isRate ? 0 : o.pathDropV);
  const e = windingV(w, x, mode.rect, mode.mask, isRate);
  if (mode.rect === 'off') return slot === 0 ? path - e / o.turnsRatio : path + e / o.turnsRatio;
  if (slot === 1) return idle;
  return mode.rect === 'b' ? path + e / o.turnsRatio : path - e / o.turnsRatio;
}

/**
 * A drain's state after an event (`settleMode`): a free drain at zero with its leakage's current
 * flowing out is held by its body diode (v set to zero), at the clamp with it flowing in by the
 * clamp (v set to the clamp's level); a held drain is freed where that current reverses.
 */
function settleDrain(drain: Drain, x: Float64Array, v: number, i: number, top: number): Drain {
  if (drain === 'free') {
    if ((x[v] as number) <= 0 && (x[i] as number) <= 0) {
      x[v] = 0;
      return 'low';
    }
    if ((x[v] as number) >= top && (x[i] as number) >= 0) {
      x[v] = top;
      return 'high';
    }
    return drain;
  }
  if (drain === 'low' && (x[i] as number) >= 0) return 'free';
  if (drain === 'high' && (x[i] as number) <= 0) return 'free';
  return drain;
}

/** Output j's path voltage at zero current (V_j + its drop; the first's `pathV`), V. */
function pathOf(w: Work, x: Float64Array, j: number): number {
  if (j === 0) return w.k.pathV;
  const o = (w.k.others ?? [])[j - 1] as PushPullLeakyOutput;
  return (x[otherAt(j).v] as number) + o.pathDropV;
}

/** Output j's turns ratio. */
function ratioOf(w: Work, j: number): number {
  return j === 0 ? w.k.turnsRatio : ((w.k.others ?? [])[j - 1] as PushPullLeakyOutput).turnsRatio;
}

/** Output j's inductor current's place in the state. */
function currentAt(j: number): number {
  return j === 0 ? IL : otherAt(j).il;
}

/** The mode the state continues in after an event (or at a half's start). */
function settleMode(w: Work, mode: Mode, x: Float64Array): Mode {
  const k = w.k;
  const top = k.inputV + k.clampV;
  const next: Mode = {
    rect: mode.rect,
    mask: mode.mask,
    a: settleDrain(mode.a, x, VA, IA, top),
    b: mode.b,
  };
  next.b = settleDrain(mode.b, x, VB, IB, top);
  const n = k.turnsRatio;
  const outputs = w.outputs;
  // Whether the winding has just fallen to zero here (conducting → freewheeling): with several
  // outputs the freewheel's referred current then equals the outputs' summed currents to the
  // rounding (the conducting mode holds ia − ib − Im = Σ IL_j/n_j), which must not take the
  // state straight back (a ulp's difference did at a two-output half, its freewheel skipped).
  let isFalling = false;
  for (let pass = 0; pass < 2 + outputs; pass++) {
    // An output whose current has reached zero stops (all of them: the rectifiers are off).
    if (next.rect !== 'off') {
      for (let j = 0; j < outputs; j++) {
        const bit = 1 << j;
        if ((next.mask & bit) === 0) continue;
        const at = currentAt(j);
        if ((x[at] as number) <= 0) {
          x[at] = 0;
          next.mask &= ~bit;
        }
      }
      if (next.mask === 0) next.rect = 'off';
    }
    if (next.rect === 'a' || next.rect === 'b') {
      const sign = next.rect === 'a' ? 1 : -1;
      const e = windingV(w, x, next.rect, next.mask);
      if (sign * e <= 0) {
        next.rect = 'freewheel';
        isFalling = outputs > 1;
      } else {
        // An output not conducting starts where the winding reaches its path's voltage.
        for (let j = 1; j < outputs; j++) {
          if ((next.mask & (1 << j)) === 0 && (sign * e) / ratioOf(w, j) >= pathOf(w, x, j)) {
            next.mask |= 1 << j;
          }
        }
        if ((next.mask & 1) === 0 && (sign * e) / n >= k.pathV) next.mask |= 1;
      }
    } else if (next.rect === 'freewheel' && !isFalling) {
      let total = (next.mask & 1) !== 0 ? (x[IL] as number) : 0;
      for (let j = 1; j < outputs; j++) {
        if ((next.mask & (1 << j)) !== 0) {
          total += ((x[otherAt(j).il] as number) * n) / ratioOf(w, j);
        }
      }
      const referred = n * ((x[IA] as number) - (x[IB] as number) - (x[IM] as number));
      if (referred >= total) next.rect = 'a';
      else if (referred <= -total) next.rect = 'b';
    } else {
      const e = windingV(w, x, 'off', 0);
      let up = 0;
      let down = 0;
      for (let j = 0; j < outputs; j++) {
        const nj = ratioOf(w, j);
        const path = pathOf(w, x, j);
        if (e / nj >= path) up |= 1 << j;
        else if (-e / nj >= path) down |= 1 << j;
      }
      if (up !== 0) {
        next.rect = 'a';
        next.mask = up;
      } else if (down !== 0) {
        next.rect = 'b';
        next.mask = down;
      }
    }
  }
  return next;
}

/**
 * Runs the state x (in place) in `mode` for `durationS`, event to event; returns the mode at the
 * end, or undefined where the events chatter. Each step (`STEPS_PER_RING` a ring) is exact. A
 * guard positive at a step's start ends the mode within it where it is not positive at the
 * step's end, or where it turns from falling to rising within the step (a minimum inside: the
 * step is a fraction of the fastest ring, so it turns at most once) and its lowest value is not
 * positive; the event is the earliest such guard's crossing, found on the stretch's Taylor
 * series (`crossing`). The peaks the half tracks are read where their rates turn within a step
 * (`trackWithin`), not at its ends only.
 */
function runFor(w: Work, mode: Mode, x: Float64Array, durationS: number): Mode | undefined {
  let left = durationS;
  let current = settleMode(w, mode, x);
  // The stretch of the current mode (it changes at events only).
  let stretch = stretchFor(w, current);
  const { trial, probe, terms, coefficients } = w;
  // A step's reads at its start and end (`Stretch.reads`), swapped as the steps go.
  let readsBefore = w.readsBefore;
  let readsAfter = w.readsAfter;
  let { rate: rateBefore, guards: before, guardRates: guardRateBefore } = readsBefore;
  let { rate: rateAfter, guards: after, guardRates: guardRateAfter } = readsAfter;
  let isCarried = false;
  while (left > 1e-18) {
    const h = Math.min(w.stepS, left);
    let hasTerms = false;
    if (h === w.stepS) {
      stretch.step ??= sparseRows(expm(stretch.m, w.stepS, w.omega, w.aug), w.n, w.n);
      sparseAffine(stretch.step, x, trial, w.n);
    } else {
      seriesTerms(stretch.mRows, x, terms);
      hasTerms = true;
      seriesAt(terms, x, h, trial);
    }
    if (!isCarried) sparseAffine(stretch.readsRows, x, readsBefore.all, w.readCount);
    sparseAffine(stretch.readsRows, trial, readsAfter.all, w.readCount);
    let end = Infinity;
    let ending = -1;
    for (let g = 0; g < w.guardCount; g++) {
      const g0 = before[g] as number;
      const g1 = after[g] as number;
      const r0 = guardRateBefore[g] as number;
      const r1 = guardRateAfter[g] as number;
      // A guard at zero and rising (an inductor current the mode has just let go of zero) holds
      // from the start.
      const isRising = g0 === 0 && r0 > 0;
      if (!(g0 > 0) && !isRising) continue;
      const isCrossed = !(g1 > 0);
      // Leaving zero: sampled on its series at sixteenths of the step, so a return narrower than
      // a step is seen (at a turn-on the inductor current can leave zero and come back within
      // nanoseconds). (Sampling every guard its rate would take to zero within a step cost the
      // push-pull scan some 60 %.)
      const isNear = isRising;
      // Else a minimum inside: where the cubic through the ends' values and rates stays above
      // zero by more than its error bound (h⁴/384·|g''''|, |g''''| taken as ω²·|g''|, four times
      // over), the guard holds.
      const isDip =
        !isCrossed &&
        !isNear &&
        r0 < 0 &&
        r1 > 0 &&
        hermiteLow(g0, g1, r0, r1, h) <= curvatureBound(w.omega, g0, g1, r0, r1, h);
      if (!isCrossed && !isNear && !isDip) continue;
      if (!hasTerms) {
        seriesTerms(stretch.mRows, x, terms);
        hasTerms = true;
      }
      // The guard's own Taylor coefficients (its rates' at the step's start).
      for (let t = 0; t < TERMS; t++) {
        coefficients[t] = guardAt(w, current, terms[t] as Float64Array, g, true);
      }
      let from = 0;
      let to = h;
      if (isNear) {
        to = NaN;
        for (let i = 1; i <= DENSE; i++) {
          const t = (h * i) / DENSE;
          if (polynomialAt(coefficients, g0, t) > 0) from = t;
          else if (i > 1 || !isRising) {
            to = t;
            break;
          } else break;
        }
        if (Number.isNaN(to)) continue;
      } else if (isDip) {
        to = rateZero(coefficients, h);
        if (polynomialAt(coefficients, g0, to) > 0) continue;
      }
      if (from >= end) continue;
      const at = crossing(coefficients, g0, from, Math.min(to, end));
      if (at < end) {
        end = at;
        ending = g;
      }
    }
    if (end === Infinity) {
      trackWithin(w, x, trial, h, rateBefore, rateAfter);
      x.set(trial);
      left -= h;
      const swap = readsBefore;
      readsBefore = readsAfter;
      readsAfter = swap;
      ({ rate: rateBefore, guards: before, guardRates: guardRateBefore } = readsBefore);
      ({ rate: rateAfter, guards: after, guardRates: guardRateAfter } = readsAfter);
      isCarried = true;
      track(w, x);
      continue;
    }
    isCarried = false;
    // The state at the crossing, just past it on the full state's guards too (their sums round
    // apart from the guard's own series by an ulp or so), so the next mode sees the event.
    seriesAt(terms, x, end, probe);
    for (let nudge = 1e-15; nudge < 1e-6 && guardAt(w, current, probe, ending) > 0;) {
      nudge *= 4;
      end = Math.min(h, end + nudge * h);
      seriesAt(terms, x, end, probe);
    }
    sparseAffine(stretch.mRows, probe, rateAfter, w.n);
    trackWithin(w, x, probe, end, rateBefore, rateAfter);
    x.set(probe);
    left -= end;
    current = settleMode(w, current, x);
    stretch = stretchFor(w, current);
    track(w, x);
    w.events += 1;
    if (w.events > 400) return undefined;
  }
  return current;
}

/** The samples a step of a guard near zero is checked at (`runFor`). */
const DENSE = 16;

/**
 * A quantity's value at t from its value g0 at the step's start and its Taylor coefficients
 * (`coefficients[k]` its (k + 1)th derivative there); with g0 undefined, its rate.
 */
function polynomialAt(coefficients: Float64Array, g0: number | undefined, t: number): number {
  let v = g0 ?? 0;
  let factor = 1;
  for (let k = 0; k < TERMS; k++) {
    if (g0 === undefined) {
      v += factor * (coefficients[k] as number);
      factor *= t / (k + 1);
    } else {
      factor *= t / (k + 1);
      v += factor * (coefficients[k] as number);
    }
  }
  return v;
}

/**
 * Where a quantity positive at `from` (g0 its value at the step's start) first comes to zero
 * within (from, to], `to` a point where it is not positive: regula falsi (Illinois) on its Taylor series, kept to a bracket
 * [positive, not positive] and returning the bracket's far end (the state there has crossed, so
 * the next mode sees it) once the bracket is 1e-15 of the step or stops shrinking. The quantity
 * falls monotonically to its first zero in the cases met (an end's sign change, or the falling
 * side of a minimum), so the bracket's root is the first one.
 * ref: regula falsi, Illinois variant (Dowell & Jarratt 1971, from memory), common practice.
 */
function crossing(coefficients: Float64Array, g0: number, from: number, to: number): number {
  let lo = from;
  let hi = to;
  let fLo = from === 0 ? g0 : polynomialAt(coefficients, g0, from);
  let fHi = polynomialAt(coefficients, g0, to);
  if (fHi > 0) return to;
  let side = 0;
  for (let it = 0; it < 80 && hi - lo > 1e-15 * to; it++) {
    let t = fHi !== fLo ? (lo * fHi - hi * fLo) / (fHi - fLo) : (lo + hi) / 2;
    if (!(t > lo && t < hi)) t = (lo + hi) / 2;
    if (t === lo || t === hi) break;
    const f = polynomialAt(coefficients, g0, t);
    if (f > 0) {
      lo = t;
      fLo = f;
      if (side === -1) fHi /= 2;
      side = -1;
    } else {
      hi = t;
      fHi = f;
      if (side === 1) fLo /= 2;
      side = 1;
    }
  }
  return hi;
}

/**
 * The zero within (0, h) of a rate given by its Taylor coefficients (the rate at 0 and at h of
 * opposite signs), by regula falsi (Illinois).
 */
function rateZero(coefficients: Float64Array, h: number): number {
  let lo = 0;
  let hi = h;
  let fLo = coefficients[0] as number;
  let fHi = polynomialAt(coefficients, undefined, h);
  let side = 0;
  let t = h / 2;
  for (let it = 0; it < 80 && hi - lo > 1e-15 * h; it++) {
    t = fHi !== fLo ? (lo * fHi - hi * fLo) / (fHi - fLo) : (lo + hi) / 2;
    if (!(t > lo && t < hi)) t = (lo + hi) / 2;
    const f = polynomialAt(coefficients, undefined, t);
    if (f === 0) return t;
    if (Math.sign(f) === Math.sign(fLo)) {
      lo = t;
      fLo = f;
      if (side === -1) fHi /= 2;
      side = -1;
    } else {
      hi = t;
      fHi = f;
      if (side === 1) fLo /= 2;
      side = 1;
    }
  }
  return t;
}

/**
 * The tracked peaks (`track`) where they fall within a step of `h` from x to `end`
 * (`rateBefore` and `rateAfter` the state's rates at its ends): where a quantity's rate turns
 * from rising to falling (for |Im|, either way), the extreme of the cubic through the ends'
 * values and rates (its error h⁴/384·|x''''|, some 1e-3 of the ring's amplitude at 8 steps a
 * ring).
 */
function trackWithin(
  w: Work,
  x: Float64Array,
  end: Float64Array,
  h: number,
  rateBefore: Float64Array,
  rateAfter: Float64Array,
): void {
  const tracked = w.tracked;
  for (let c = 0; c < tracked.length; c++) {
    const i = tracked[c] as number;
    const r0 = rateBefore[i] as number;
    const r1 = rateAfter[i] as number;
    if (i === IA && !w.isOn) continue;
    if (i === IM) {
      if (!(r0 * r1 < 0)) continue;
      // Its largest magnitude: the cubic's highest where Im turns down, its lowest where it turns up.
      const sign = r0 > 0 ? 1 : -1;
      const low = hermiteLow(
        -sign * (x[i] as number),
        -sign * (end[i] as number),
        -sign * r0,
        -sign * r1,
        h,
      );
      w.peakMagnetizingA = Math.max(w.peakMagnetizingA, -low);
      continue;
    }
    if (!(r0 > 0 && r1 < 0)) continue;
    const v = -hermiteLow(-(x[i] as number), -(end[i] as number), -r0, -r1, h);
    if (i === IL) w.peakInductorA = Math.max(w.peakInductorA, v);
    else if (i === IA) w.peakSwitchA = Math.max(w.peakSwitchA, v);
    else if (i >= N1) {
      const j = (i - N1) / 3;
      w.otherPeaksA[j] = Math.max(w.otherPeaksA[j] as number, v);
    } else w.peakDrainV = Math.max(w.peakDrainV, v);
  }
}

/**
 * The lowest value over [0, h] of the cubic with values g0, g1 and rates r0, r1 at its ends
 * (cubic Hermite interpolation; common practice).
 */
function hermiteLow(g0: number, g1: number, r0: number, r1: number, h: number): number {
  // p(s) = g0 + a·s + c2·s² + c3·s³ over s ∈ [0, 1], p'(s) = a + 2·c2·s + 3·c3·s².
  const a = r0 * h;
  const b = r1 * h;
  const c2 = 3 * (g1 - g0) - 2 * a - b;
  const c3 = 2 * (g0 - g1) + a + b;
  let low = Math.min(g0, g1);
  const qa = 3 * c3;
  const qb = 2 * c2;
  // The cubic's turning points in (0, 1): p'(s) = a + qb·s + qa·s² = 0.
  let s1 = -1;
  let s2 = -1;
  if (Math.abs(qa) <= 1e-14 * (Math.abs(qb) + Math.abs(a))) {
    if (qb !== 0) s1 = -a / qb;
  } else {
    const disc = qb * qb - 4 * qa * a;
    if (disc >= 0) {
      const q = -0.5 * (qb + (qb >= 0 ? Math.sqrt(disc) : -Math.sqrt(disc)));
      if (q !== 0) {
        s1 = q / qa;
        s2 = a / q;
      }
    }
  }
  if (s1 > 0 && s1 < 1) low = Math.min(low, g0 + s1 * (a + s1 * (c2 + s1 * c3)));
  if (s2 > 0 && s2 < 1) low = Math.min(low, g0 + s2 * (a + s2 * (c2 + s2 * c3)));
  return low;
}

/**
 * The cubic's error bound for a guard over a step of h (`hermiteLow`): h⁴/384·|g''''|, with
 * |g''''| taken as ω²·|g''| (the fastest ring's), |g''| the cubic's own at the larger end, four
 * times over (the slower modes' share and the ends' phase).
 */
function curvatureBound(
  omega: number,
  g0: number,
  g1: number,
  r0: number,
  r1: number,
  h: number,
): number {
  // The cubic's second derivative at its ends (per s², s = t/h): 2·c2 and 2·c2 + 6·c3.
  const a = r0 * h;
  const b = r1 * h;
  const c2 = 3 * (g1 - g0) - 2 * a - b;
  const c3 = 2 * (g0 - g1) + a + b;
  const second = Math.max(Math.abs(2 * c2), Math.abs(2 * c2 + 6 * c3));
  return (4 * (omega * h) ** 2 * second) / 384;
}

/** The half's highest inductor current and largest magnetizing magnitude, updated from x. */
function track(w: Work, x: Float64Array): void {
  if ((x[IL] as number) > w.peakInductorA) w.peakInductorA = x[IL] as number;
  const im = Math.abs(x[IM] as number);
  if (im > w.peakMagnetizingA) w.peakMagnetizingA = im;
  if (w.isOn && (x[IA] as number) > w.peakSwitchA) w.peakSwitchA = x[IA] as number;
  const drainV = Math.max(x[VA] as number, x[VB] as number);
  if (drainV > w.peakDrainV) w.peakDrainV = drainV;
  for (let j = 1; j < w.outputs; j++) {
    const il = x[otherAt(j).il] as number;
    if (il > (w.otherPeaksA[j - 1] as number)) w.otherPeaksA[j - 1] = il;
  }
}

/**
 * Taylor terms of the exact solution from x: d_k = M^k·[x; 1] (k = 1 … TERMS); at a step of
 * a quarter of the fastest ring (ω·h ≤ π/2) the series' remainder is below 1e-15 of its size.
 */
const TERMS = 20;

function seriesTerms(m: SparseRows, x: Float64Array, terms: Float64Array[]): void {
  let previous: Float64Array = x;
  const N = x.length;
  for (let k = 0; k < TERMS; k++) {
    const out = terms[k] as Float64Array;
    sparseAffine(m, previous, out, N, k === 0);
    previous = out;
  }
}

function seriesAt(terms: Float64Array[], x: Float64Array, t: number, out: Float64Array): void {
  out.set(x);
  const N = x.length;
  let factor = 1;
  for (let k = 0; k < TERMS; k++) {
    factor *= t / (k + 1);
    const d = terms[k] as Float64Array;
    for (let i = 0; i < N; i++) out[i] = (out[i] as number) + factor * (d[i] as number);
  }
}

/** One half from the turn-on state u = [ia, ib, vb, IL, Im] at duty cycle `duty` (over T). */
export interface LeakyHalfRun {
  /**
   * The state at the half's end, mirrored into the next half's frame: [ia, ib, va, vb, IL, Im],
   * then each further output's inductor current and voltage.
   */
  end: Float64Array;
  /** Each further output's mean inductor current over the half, A. */
  otherMeansA: number[];
  /** Each further output's highest inductor current over the half, A. */
  otherPeaksA: number[];
  /** Mean inductor current over the half, A. */
  meanInductorA: number;
  /** Charge into the clamp over the half, C. */
  clampChargeC: number;
  /** The state as the switch opens: [ia, ib, va, vb, IL, Im]. */
  atTurnOff: Float64Array;
  /** The off drain's voltage at the half's end (before the next turn-on pins it), V. */
  endDrainV: number;
  /** The highest inductor current over the half (at the steps and events), A. */
  peakInductorA: number;
  /** The largest magnitude of the magnetizing current over the half, A. */
  peakMagnetizingA: number;
  /** The driven switch's highest current while on (at the steps and events), A. */
  peakSwitchA: number;
  /** The highest drain voltage over the half (at the steps and events), V. */
  peakDrainV: number;
}

function runHalf(w: Work, duty: number, u: readonly number[]): LeakyHalfRun | undefined {
  const k = w.k;
  if (w.budget !== undefined && !(--w.budget.halves >= 0)) return undefined;
  const onS = duty * 2 * k.halfS;
  if (!(onS > 0 && onS < k.halfS)) return undefined;
  const x = new Float64Array(w.n);
  x[IA] = u[0] as number;
  x[IB] = u[1] as number;
  x[VA] = 0;
  x[VB] = Math.min(Math.max(u[2] as number, 0), k.inputV + k.clampV);
  x[IL] = Math.max(0, u[3] as number);
  x[IM] = u[4] as number;
  // The further outputs: u holds each one's inductor current and voltage after the first five.
  let mask = (x[IL] as number) > 0 ? 1 : 0;
  for (let j = 1; j < w.outputs; j++) {
    const at = otherAt(j);
    const il = Math.max(0, u[3 + 2 * j] as number);
    x[at.il] = il;
    x[at.v] = u[4 + 2 * j] as number;
    w.otherPeaksA[j - 1] = il;
    if (il > 0) mask |= 1 << j;
  }
  w.events = 0;
  w.peakInductorA = x[IL] as number;
  w.peakMagnetizingA = Math.abs(x[IM] as number);
  w.peakSwitchA = Math.max(0, x[IA] as number);
  w.peakDrainV = x[VB] as number;
  w.isOn = true;
  const startMode: Mode = { rect: 'freewheel', mask, a: 'on', b: 'free' };
  if (mask === 0) startMode.rect = 'off';
  let mode = runFor(w, startMode, x, onS);
  if (mode === undefined) return undefined;
  const atTurnOff = x.slice(0, 6);
  w.isOn = false;
  mode = runFor(w, { ...mode, a: 'free' }, x, k.halfS - onS);
  if (mode === undefined) return undefined;
  const end = new Float64Array(6 + 2 * (w.outputs - 1));
  end[0] = x[IB] as number;
  end[1] = x[IA] as number;
  end[2] = x[VB] as number;
  end[3] = x[VA] as number;
  end[4] = x[IL] as number;
  end[5] = -(x[IM] as number);
  const otherMeansA: number[] = [];
  for (let j = 1; j < w.outputs; j++) {
    const at = otherAt(j);
    end[4 + 2 * j] = x[at.il] as number;
    end[5 + 2 * j] = x[at.v] as number;
    otherMeansA.push((x[at.q] as number) / k.halfS);
  }
  return {
    end,
    otherMeansA,
    otherPeaksA: Array.from(w.otherPeaksA),
    meanInductorA: (x[Q] as number) / k.halfS,
    clampChargeC: x[QC] as number,
    atTurnOff,
    endDrainV: x[VB] as number,
    peakInductorA: w.peakInductorA,
    peakMagnetizingA: w.peakMagnetizingA,
    peakSwitchA: w.peakSwitchA,
    peakDrainV: w.peakDrainV,
  };
}

/**
 * The residuals of a run from u: the five periodicity residuals (the mirrored end less the
 * start), then for each further output its inductor current's and its charge balance's (its
 * mean inductor current less its load: its voltage is the unknown that settles it).
 */
function residuals(run: LeakyHalfRun, u: readonly number[], k: PushPullLeakyCircuit): number[] {
  const e = run.end;
  const r = [
    (e[0] as number) - (u[0] as number),
    (e[1] as number) - (u[1] as number),
    (e[3] as number) - (u[2] as number),
    (e[4] as number) - Math.max(0, u[3] as number),
    (e[5] as number) - (u[4] as number),
  ];
  const others = k.others ?? [];
  for (let j = 1; j <= others.length; j++) {
    r.push((e[4 + 2 * j] as number) - Math.max(0, u[3 + 2 * j] as number));
    r.push((run.otherMeansA[j - 1] as number) - (others[j - 1] as PushPullLeakyOutput).loadA);
  }
  return r;
}

/** The next half's start from a run's end: [ia, ib, vb, IL, Im] and each further IL_j, V_j. */
function startOf(run: LeakyHalfRun): number[] {
  const e = run.end;
  const u = [e[0], e[1], e[3], e[4], e[5]] as number[];
  for (let i = 6; i < e.length; i++) u.push(e[i] as number);
  return u;
}

/** A periodic half found by {@link solvePushPullLeakyHalf}. */
export interface PushPullLeakyHalf {
  /** The switch's duty cycle over the period. */
  dutyCycle: number;
  /** The turn-on state: ia, ib, vb, IL, Im (A, A, V, A, A). */
  start: number[];
  meanInductorA: number;
  /** Power into the clamp, both switches: Vc times the clamp's charge, twice a period, W. */
  clampW: number;
  /** The state as the switch opens: ia, ib, va, vb, IL, Im. */
  atTurnOff: number[];
  /** The inductor current at the gate's turn-off, A. */
  inductorTurnOffA: number;
  /** The highest inductor current over the half, A. */
  inductorPeakA: number;
  /**
   * The largest magnitude of the magnetizing current over the half, A: the halves mirror, so
   * the flux swings over twice it.
   */
  magnetizingPeakA: number;
  /** The driven switch's highest current while on (its leakage's), A. */
  switchPeakA: number;
  /** The highest drain voltage over the half (the off drain's ring, or the clamp), V. */
  drainPeakV: number;
  /** The drain of the switch turning on, just before it does, V. */
  turnOnDrainV: number;
  /**
   * Each further output: its voltage (from its charge balance), its mean inductor current over
   * the half (its load) and its highest inductor current, V, A, A.
   */
  others: { voltageV: number; meanA: number; peakA: number }[];
  /** Newton steps taken. */
  steps: number;
  /** Whether the circuit settles on it (`isSettling`). */
  isSettling: boolean;
}

/** How many halves a solve may still run (`solvePushPullLeakyRegulated` shares one). */
export interface LeakyBudget {
  halves: number;
}

/**
 * What one held-duty solve hands the next in a regulated search: the circuit's work (its
 * stretches' exponentials), the last Jacobian built, and whether to skip the settling check
 * (the search checks its answer's alone).
 */
export interface LeakyCarry {
  work?: Work;
  jacobian?: number[] | undefined;
  skipSettling?: boolean;
}

/** Where {@link solvePushPullLeakyHalf} starts (a nearby half's start, or none). */
export interface PushPullLeakyGuess {
  dutyCycle: number;
  start?: readonly number[];
}

const NEWTON_STEPS = 60;

/** The share of the residuals' norm a Broyden step must bring it below to be kept. */
const BROYDEN_RATIO = 0.9;

/**
 * The residuals' scaled norm below which a carried Jacobian is tried (the chord method): near
 * the solution, where the map is smooth between its events; farther out a full Newton step with
 * its line search (a chord from far out stalled at one duty cycle of the test's circuit).
 */
const CHORD_NORM = 1e-2;

/**
 * The periodic half at a duty cycle (`loadA` undefined: the duty cycle held at the guess's) or
 * the duty cycle at which it delivers `loadA`, by Newton's method with forward differences from
 * `guess` (the turn-on state from a few halves run forward from rest where none is given), each
 * step held to a fifth of the duty cycle and a tenth of the input in the drain's voltage.
 * Undefined where it does not converge.
 */
export function solvePushPullLeakyHalf(
  k: PushPullLeakyCircuit,
  guess: PushPullLeakyGuess,
  loadA?: number,
  budget?: LeakyBudget,
  carry?: LeakyCarry,
): PushPullLeakyHalf | undefined {
  if (!(k.leakageH > 0 && k.capacitanceF > 0 && k.magnetizingH > 0)) return undefined;
  const others = k.others ?? [];
  const w = carry?.work ?? workOf(k);
  if (carry !== undefined) carry.work = w;
  w.budget = budget;
  let duty = guess.dutyCycle;
  let u: number[];
  if (guess.start !== undefined) u = [...guess.start];
  else {
    // From rest, run forward a few periods: the drains settle towards their rings.
    const imA = -(k.inputV * duty * 2 * k.halfS) / (2 * k.magnetizingH);
    u = [0, 0, 2 * k.inputV, 0, imA];
    for (const o of others) u.push(0, o.voltageGuessV);
    for (let i = 0; i < 24; i++) {
      const run = runHalf(w, duty, u);
      if (run === undefined) return undefined;
      u = startOf(run);
    }
  }
  const isRegulated = loadA !== undefined;
  // The unknowns: the five of the turn-on state, each further output's IL_j and V_j, and where
  // regulated the duty cycle (last).
  const dutyAt = 5 + 2 * others.length;
  const size = isRegulated ? dutyAt + 1 : dutyAt;
  const currentScale = Math.max(loadA ?? 0, Math.abs(u[4] as number), 1e-3);
  // The residuals' scales (by row) and the unknowns' (by column; the duty cycle's its own).
  const scales = [currentScale, currentScale, k.inputV, currentScale, currentScale];
  const unknownScales = [...scales];
  for (let j = 1; j <= others.length; j++) {
    scales.push(currentScale, currentScale);
    unknownScales.push(currentScale, Math.max(1, Math.abs(u[4 + 2 * j] as number)));
  }
  scales.push(currentScale);
  unknownScales.push(currentScale);
  /** IL and each further IL_j held at zero or above. */
  const clampCurrents = (v: number[]): void => {
    v[3] = Math.max(0, v[3] as number);
    for (let j = 1; j <= others.length; j++) v[3 + 2 * j] = Math.max(0, v[3 + 2 * j] as number);
  };
  const evaluate = (d: number, v: readonly number[]): Trial | undefined => {
    const run = runHalf(w, d, v);
    if (run === undefined) return undefined;
    const r = residuals(run, v, k);
    if (isRegulated) r.push(run.meanInductorA - (loadA as number));
    const norm = r.reduce((sum, value, i) => sum + Math.abs(value) / (scales[i] as number), 0);
    return { run, r, norm };
  };
  let current = evaluate(duty, u);
  // A Jacobian carried from a nearby solve (held duty cycles only) is tried first: where its step
  // lowers the residuals' norm it is kept (the chord method: one half a step, not six); where not,
  // it is built afresh.
  let jacobian = !isRegulated ? carry?.jacobian : undefined;
  let isCarried = jacobian !== undefined;
  let estimate: number[] | undefined;
  /**
   * The Newton step from (u, duty) on the Jacobian `j` at the residuals r0, shrunk by `shrink`
   * and held to a fifth of the duty cycle and a tenth of the input in the drain: the point and
   * its evaluation (undefined: not evaluable; null: the step is not finite).
   */
  const stepTo = (
    j: number[],
    r0: readonly number[],
    shrink: number,
  ): { v: number[]; d: number; result: Trial } | undefined | null => {
    const delta = solveLinear(
      j,
      r0.map((r) => -r),
    );
    if (delta === undefined || !delta.every(Number.isFinite)) return null;
    let cap = 1;
    if (isRegulated && Math.abs(delta[dutyAt] as number) > 0.2 * duty) {
      cap = (0.2 * duty) / Math.abs(delta[dutyAt] as number);
    }
    if (Math.abs(delta[2] as number) * cap > 0.1 * k.inputV) {
      cap = (0.1 * k.inputV) / Math.abs(delta[2] as number);
    }
    // A further output's voltage moved by at most a fifth of its scale a step.
    for (let j = 1; j <= others.length; j++) {
      const dv = Math.abs(delta[4 + 2 * j] as number);
      const limit = 0.2 * (unknownScales[4 + 2 * j] as number);
      if (dv * cap > limit) cap = limit / dv;
    }
    const held = cap * shrink;
    const v = u.map((value, i) => value + held * (delta[i] as number));
    clampCurrents(v);
    const d = isRegulated ? duty + held * (delta[dutyAt] as number) : duty;
    if (!v.every(Number.isFinite) || !(d > 0 && d < 0.5)) return undefined;
    const result = evaluate(d, v);
    return result === undefined ? undefined : { v, d, result };
  };
  /**
   * Broyden's ("good") update of `j` in place for the step from (u, duty) to (v, d) that took
   * the residuals from r0 to r, in the scaled variables (each unknown over its scale).
   * ref: Broyden 1965 (from memory), common practice.
   */
  const update = (
    j: number[],
    v: readonly number[],
    d: number,
    r: readonly number[],
    r0: readonly number[],
  ): void => {
    const s = new Array<number>(size);
    for (let i = 0; i < size; i++) {
      s[i] = i === dutyAt ? d - duty : (v[i] as number) - (u[i] as number);
    }
    let ss = 0;
    const weights = new Array<number>(size);
    for (let i = 0; i < size; i++) {
      const scale = i === dutyAt ? Math.max(duty, 1e-3) : (unknownScales[i] as number);
      weights[i] = (s[i] as number) / (scale * scale);
      ss += (s[i] as number) * (weights[i] as number);
    }
    if (!(ss > 0)) return;
    for (let row = 0; row < size; row++) {
      let js = 0;
      for (let col = 0; col < size; col++)
        js += (j[row * size + col] as number) * (s[col] as number);
      const miss = (r[row] as number) - (r0[row] as number) - js;
      for (let col = 0; col < size; col++) {
        j[row * size + col] =
          (j[row * size + col] as number) + (miss * (weights[col] as number)) / ss;
      }
    }
  };
  for (let step = 0; step < NEWTON_STEPS; step++) {
    if (current === undefined) return undefined;
    const { run: f0, r: r0, norm } = current;
    if (norm <= 1e-9) {
      return {
        dutyCycle: duty,
        start: u,
        meanInductorA: f0.meanInductorA,
        clampW: Number.isFinite(k.clampV) ? (k.clampV * f0.clampChargeC) / k.halfS : 0,
        atTurnOff: [...f0.atTurnOff],
        inductorTurnOffA: f0.atTurnOff[IL] as number,
        inductorPeakA: f0.peakInductorA,
        magnetizingPeakA: f0.peakMagnetizingA,
        switchPeakA: f0.peakSwitchA,
        drainPeakV: f0.peakDrainV,
        turnOnDrainV: f0.end[2] as number,
        others: others.map((_, i) => ({
          voltageV: u[6 + 2 * i] as number,
          meanA: f0.otherMeansA[i] as number,
          peakA: f0.otherPeaksA[i] as number,
        })),
        steps: step,
        isSettling: carry?.skipSettling === true ? false : isSettling(w, duty, u, f0),
      };
    }
    if (isCarried && jacobian !== undefined && norm <= CHORD_NORM) {
      const chord = solveLinear(
        jacobian,
        r0.map((r) => -r),
      );
      if (chord !== undefined && chord.every(Number.isFinite)) {
        const v = u.map((value, i) => value + (chord[i] as number));
        clampCurrents(v);
        const trial = v.every(Number.isFinite) ? evaluate(duty, v) : undefined;
        // Kept where it at least halves the norm (a slow chord costs more than a fresh Jacobian).
        if (trial !== undefined && trial.norm < 0.5 * norm) {
          u = v;
          current = trial;
          continue;
        }
      }
      isCarried = false;
    }
    // Broyden's update of the last Jacobian along the steps taken since it was built (one half a
    // step, not six): its step kept where it lowers the norm by a tenth, else a fresh Jacobian.
    if (estimate !== undefined) {
      const trial = stepTo(estimate, r0, 1);
      if (trial !== undefined && trial !== null && trial.result.norm < BROYDEN_RATIO * norm) {
        update(estimate, trial.v, trial.d, trial.result.r, r0);
        u = trial.v;
        duty = trial.d;
        current = trial.result;
        continue;
      }
      estimate = undefined;
    }
    jacobian = new Array<number>(size * size).fill(0);
    for (let col = 0; col < size; col++) {
      const isDuty = col === dutyAt;
      const h = isDuty ? 1e-7 * duty : 1e-7 * (unknownScales[col] as number);
      const v = [...u];
      let d = duty;
      if (isDuty) d += h;
      else v[col] = (v[col] as number) + h;
      const f = evaluate(d, v);
      if (f === undefined) return undefined;
      for (let row = 0; row < size; row++) {
        jacobian[row * size + col] = ((f.r[row] as number) - (r0[row] as number)) / h;
      }
    }
    if (carry !== undefined && !isRegulated) {
      carry.jacobian = jacobian;
      isCarried = true;
    }
    // Backtracking: the events make the map piecewise smooth, and a full step across an event's
    // boundary can cycle; a step is taken where it lowers the residuals' norm.
    let accepted = false;
    for (let attempt = 0, shrink = 1; attempt < 8 && !accepted; attempt++, shrink /= 2) {
      const trial = stepTo(jacobian, r0, shrink);
      if (trial === null) return undefined;
      if (trial !== undefined && trial !== null && trial.result.norm < norm) {
        estimate = [...jacobian];
        update(estimate, trial.v, trial.d, trial.result.r, r0);
        u = trial.v;
        duty = trial.d;
        current = trial.result;
        accepted = true;
      }
    }
    if (!accepted) {
      // No step lowers the norm: a few halves run forward (the circuit's own settling) instead.
      for (let i = 0; i < 8; i++) {
        const run = runHalf(w, duty, u);
        if (run === undefined) return undefined;
        u = startOf(run);
      }
      current = evaluate(duty, u);
    }
  }
  return undefined;
}

/**
 * Whether the circuit settles on the periodic half found at its duty cycle: the spectral radius
 * of the half-map's Jacobian (the turn-on state to the next, by forward differences) below one,
 * read from the growth of a vector under 64 applications of it. A half can be periodic and
 * unstable: at some duty cycles the undamped circuit alternates between two halves instead.
 * ref: the power method (common practice).
 */
function isSettling(w: Work, duty: number, u: readonly number[], f0: LeakyHalfRun): boolean {
  if (w.outputs > 1) return isSettlingForward(w, duty, u);
  // The map's places in u: the turn-on state's five and each further output's inductor current
  // (its voltage held, as the circuit's output capacitor holds it over many periods).
  const places = [0, 1, 2, 3, 4];
  for (let j = 1; j < w.outputs; j++) places.push(3 + 2 * j);
  const p = places.length;
  const m: number[] = [];
  const base = residuals(f0, u, w.k);
  for (let col = 0; col < p; col++) {
    const at = places[col] as number;
    const h = 1e-7 * Math.max(at === 2 ? w.k.inputV : 1e-3, Math.abs(u[at] as number));
    const v = [...u];
    v[at] = (v[at] as number) + h;
    const f = runHalf(w, duty, v);
    if (f === undefined) return false;
    const r = residuals(f, v, w.k);
    for (let row = 0; row < p; row++) {
      const rowAt = places[row] as number;
      m[row * p + col] =
        ((r[rowAt] as number) - (base[rowAt] as number)) / h + (row === col ? 1 : 0);
    }
  }
  let x = [1, -0.7, 0.4, 0.9, -0.3];
  for (let j = 1; j < w.outputs; j++) x.push(j % 2 === 1 ? 0.6 : -0.5);
  let logGrowth = 0;
  for (let it = 0; it < 64; it++) {
    const y = new Array<number>(p).fill(0);
    for (let row = 0; row < p; row++) {
      for (let col = 0; col < p; col++) {
        y[row] = (y[row] as number) + (m[row * p + col] as number) * (x[col] as number);
      }
    }
    const size = Math.hypot(...y);
    if (!(size > 0)) return true;
    logGrowth += Math.log(size / Math.hypot(...x));
    x = y.map((value) => value / size);
  }
  return logGrowth / 64 < 0;
}

/**
 * Halves {@link isSettlingForward} runs, and the one after which it first reads the distance.
 */
const SETTLING_HALVES = 48;
const SETTLING_FIRST = 8;
/** The share of the distance after `SETTLING_FIRST` halves the last must be below. */
const SETTLING_SHRINK = 0.5;

/**
 * With several outputs, whether the circuit settles on the periodic half at its duty cycle, read
 * by running it: from the half's start with the magnetizing current and each inductor current
 * moved by 1e-4 of the current scale, `SETTLING_HALVES` halves forward (the further outputs'
 * voltages held), the distance from the periodic start (each place over its scale) at the end
 * below half of what it was after `SETTLING_FIRST` halves, or below 1e-9. The power method on a
 * forward-difference Jacobian (`isSettling`, one output) read the spectral radius above one at a
 * two-output corner whose half, run forward from such a start, came back to it within 1e-7
 * (seed 7 spec 21 of `model-fallback-scan.ts` at 300 V): a difference step of 1e-10 A moves an
 * event across a step's boundary there. Near-neutral modes (a further output conducting through
 * the half, its voltage held) drift away and are not taken.
 */
function isSettlingForward(w: Work, duty: number, u: readonly number[]): boolean {
  const k = w.k;
  const currentScale = Math.max(Math.abs(u[4] as number), Math.abs(u[3] as number), 1e-3);
  const places = [0, 1, 2, 3, 4];
  for (let j = 1; j < w.outputs; j++) places.push(3 + 2 * j);
  const scaleOf = (at: number): number => (at === 2 ? k.inputV : currentScale);
  const distance = (v: readonly number[]): number => {
    let sum = 0;
    for (const at of places) {
      sum += Math.abs((v[at] as number) - (u[at] as number)) / scaleOf(at);
    }
    return sum;
  };
  let v = [...u];
  v[4] = (v[4] as number) + 1e-4 * currentScale;
  for (let j = 1; j < w.outputs; j++) {
    v[3 + 2 * j] = (v[3 + 2 * j] as number) + 1e-4 * currentScale;
  }
  let first = NaN;
  for (let i = 1; i <= SETTLING_HALVES; i++) {
    const run = runHalf(w, duty, v);
    if (run === undefined) return false;
    v = startOf(run);
    if (i === SETTLING_FIRST) first = distance(v);
  }
  const last = distance(v);
  return last <= 1e-9 || last < SETTLING_SHRINK * first;
}

/** One evaluation of the residuals: the half run, its residuals and their scaled norm. */
interface Trial {
  run: LeakyHalfRun;
  r: number[];
  norm: number;
}

/** One half run from `start` at `dutyCycle` (the bench's and the tests' look at its stretches). */
export function runPushPullLeakyHalf(
  k: PushPullLeakyCircuit,
  dutyCycle: number,
  start: readonly number[],
): LeakyHalfRun | undefined {
  return runHalf(workOf(k), dutyCycle, start);
}

/**
 * Halves a regulated search may run in all (a held duty cycle's solve takes some 30–60; the
 * scan corner's searches 300–390): a search that does not close within it gives up, so a corner
 * where no half settles costs a bounded time (one at 200 V took 2.4 s before).
 */
const REGULATED_HALVES = 600;

/**
 * Halves the joint Newton solve within a bracket may run (its steps take seven each; the test
 * circuit's 400 V corner closed in four steps, 29 halves; its 300 V one, from a wide bracket,
 * wandered for 43 steps): past it, regula falsi closes the bracket.
 */
const JOINT_HALVES = 36;

/**
 * The duty cycle at which the periodic half delivers `loadA` at the held output: the half at a
 * held duty cycle ({@link solvePushPullLeakyHalf}, each started from the last one's turn-on state)
 * and its mean inductor current against the load, bracketed from `guessDuty` (stepped by a
 * quarter down or up until the excess changes sign; a duty cycle whose half does not converge is
 * stepped past) and closed by the Illinois variant of regula falsi, bisecting where a trial does
 * not converge, to 1e-9 of the load. Undefined where no bracket is found, the bracket closes on a
 * jump, or the half found does not settle (`isSettling`).
 * ref: regula falsi, Illinois variant (Dowell & Jarratt 1971, from memory), common practice.
 */
export function solvePushPullLeakyRegulated(
  k: PushPullLeakyCircuit,
  loadA: number,
  guessDuty: number,
  halves = REGULATED_HALVES,
): PushPullLeakyHalf | undefined {
  let start: readonly number[] | undefined;
  // The same budget whatever the number of outputs, although with several a Jacobian is
  // 5 + 2·(outputs − 1) halves, not 5 (seed 7 spec 21's two-output 300 V slow-ring corner closed
  // in some 2190 halves): a budget growing with the unknowns' count squared took the same corners
  // of `model-fallback-scan.ts --seed 11 --count 150` and doubled the push-pull `throw-scan.ts`
  // (seed 5, 200 specs: 7 s on main, 14 s with this budget, 30 s with the grown one), most of it
  // in searches that do not close.
  const budget: LeakyBudget = { halves };
  const carry: LeakyCarry = { skipSettling: true };
  const at = (d: number): PushPullLeakyHalf | undefined => {
    const half = solvePushPullLeakyHalf(
      k,
      { dutyCycle: d, ...(start === undefined ? {} : { start }) },
      undefined,
      budget,
      carry,
    );
    if (half !== undefined) start = half.start;
    return half;
  };
  const minDuty = 1e-3;
  const maxDuty = 0.5 * (1 - 1e-3);
  let d0 = Math.min(Math.max(guessDuty, minDuty), maxDuty);
  let h0 = at(d0);
  let tries = 0;
  while (h0 === undefined && tries++ < 4) {
    d0 *= 0.9;
    h0 = at(d0);
  }
  if (h0 === undefined) return undefined;
  let lo = d0;
  let hi = d0;
  let gLo = h0.meanInductorA - loadA;
  let gHi = gLo;
  let best = h0;
  const direction = gLo > 0 ? -1 : 1;
  for (let step = 0; step < 40 && Math.sign(gLo) === Math.sign(gHi); step++) {
    const edge = direction < 0 ? lo : hi;
    const next = direction < 0 ? Math.max(minDuty, edge * 0.75) : Math.min(maxDuty, edge * 1.25);
    if (next === edge) return undefined;
    const h = at(next);
    if (direction < 0) lo = next;
    else hi = next;
    if (h === undefined) continue;
    const g = h.meanInductorA - loadA;
    if (direction < 0) gLo = g;
    else gHi = g;
    if (Math.sign(g) !== Math.sign(direction < 0 ? gHi : gLo)) best = h;
  }
  if (Math.sign(gLo) === Math.sign(gHi)) return undefined;
  // Within the bracket, Newton's method on the duty cycle and the turn-on state together (the
  // load's row added), from the bracket's secant and the last solve's turn-on state: one solve,
  // where regula falsi takes one held-duty solve a trial. Taken where it lands inside the bracket
  // and delivers the load; else regula falsi from the bracket as before.
  const tryJoint = (): PushPullLeakyHalf | undefined => {
    if (start === undefined) return undefined;
    const secant = (lo * gHi - hi * gLo) / (gHi - gLo);
    const own: LeakyBudget = { halves: Math.min(JOINT_HALVES, budget.halves) };
    const joint = solvePushPullLeakyHalf(
      k,
      { dutyCycle: secant > lo && secant < hi ? secant : (lo + hi) / 2, start },
      loadA,
      own,
      carry,
    );
    budget.halves -= Math.min(JOINT_HALVES, budget.halves) - Math.max(0, own.halves);
    if (
      joint !== undefined &&
      joint.dutyCycle >= lo &&
      joint.dutyCycle <= hi &&
      Math.abs(joint.meanInductorA - loadA) <= 1e-9 * loadA
    ) {
      return settled(k, joint, budget, carry);
    }
    return undefined;
  };
  const joint = tryJoint();
  if (joint !== undefined) return joint;
  // Illinois: the retained end's value halved each time the same end is kept twice.
  let side = 0;
  for (let it = 0; it < 80; it++) {
    let trial = (lo * gHi - hi * gLo) / (gHi - gLo);
    if (!(trial > lo && trial < hi)) trial = (lo + hi) / 2;
    let h = at(trial);
    if (h === undefined) {
      trial = (lo + hi) / 2;
      h = at(trial);
      if (h === undefined) return undefined;
    }
    const g = h.meanInductorA - loadA;
    best = h;
    if (Math.abs(g) <= 1e-9 * loadA) return settled(k, h, budget, carry);
    if (Math.sign(g) === Math.sign(gLo)) {
      lo = trial;
      gLo = g;
      if (side === -1) gHi /= 2;
      side = -1;
    } else {
      hi = trial;
      gHi = g;
      if (side === 1) gLo /= 2;
      side = 1;
    }
    if (hi - lo <= 1e-12) return undefined;
    // The joint solve again from the narrower bracket (twice at most).
    if (it === 1 || it === 3) {
      const closer = tryJoint();
      if (closer !== undefined) return closer;
    }
  }
  return Math.abs(best.meanInductorA - loadA) <= 1e-6 * loadA
    ? settled(k, best, budget, carry)
    : undefined;
}

/** The half found, with its settling checked (`isSettling`), where it settles; else undefined. */
function settled(
  k: PushPullLeakyCircuit,
  half: PushPullLeakyHalf,
  budget: LeakyBudget,
  carry: LeakyCarry,
): PushPullLeakyHalf | undefined {
  const w = carry.work ?? workOf(k);
  w.budget = budget;
  const f0 = runHalf(w, half.dutyCycle, half.start);
  if (f0 === undefined || !isSettling(w, half.dutyCycle, half.start, f0)) return undefined;
  return { ...half, isSettling: true };
}
