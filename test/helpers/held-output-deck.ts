/**
 * An ngspice deck with its first output held at `heldV` (the output capacitor becomes a voltage
 * source, the load goes) and ngspice's mean output-inductor current over [fromS, toS] measured as
 * `delivered_a`. At a few percent load an output settles over thousands of periods; holding it at
 * trial voltages and comparing the delivered current with the load each would draw finds the
 * settled output in some 100 periods (the root of the difference). Used by the light-load netlist
 * tests and `test/bench/light-load-probe.ts`.
 */
export function holdFirstOutput(deck: string, heldV: number, fromS: number, toS: number): string {
  return deck
    .replace(/^Cout1 (\S+) (\S+) .*$/m, (_line, a: string, b: string) => {
      return `Vheld ${a} ${b} DC ${heldV}`;
    })
    .replace(/^Rload1 .*$/m, '')
    .replace(/^\.tran /m, `.meas tran delivered_a AVG i(Lout1) from=${fromS} to=${toS}\n.tran `);
}

/**
 * A push-pull deck as the leaky half sees its circuit: the clamp held by a source at `clampV`
 * above the rail (its capacitor and resistor out), no damping resistor across the leakages, and
 * with `drainOhm` each drain capacitance's series resistor at that value (the deck's 1 Ω
 * otherwise; the half has none). With `clampMeanS` the clamp source's mean current over that
 * window is measured as `clamp_a`. Used by the push-pull's leaky-half netlist tests and
 * `test/bench/push-pull-leaky-several-probe.ts`.
 */
export function holdPushPullClamp(
  deck: string,
  clampV: number,
  options: { drainOhm?: number; clampMeanS?: { fromS: number; toS: number } } = {},
): string {
  const { drainOhm, clampMeanS } = options;
  const out = deck
    .replace(/^Rlk\S+ .*$/gm, '')
    .replace(/^(Rq[ab]c \S+ \S+) \S+$/gm, (line, head: string) =>
      drainOhm === undefined ? line : `${head} ${drainOhm}`,
    )
    .replace(
      /^Cclamp (\S+) (\S+) .*$/m,
      (_l, a: string, b: string) => `Vclampheld ${a} ${b} DC ${clampV}`,
    )
    .replace(/^Rclamp .*$/m, '')
    .replace(/^Vclamp held .*$/m, '');
  if (clampMeanS === undefined) return out;
  const { fromS, toS } = clampMeanS;
  return out.replace(
    /^\.tran /m,
    `.meas tran clamp_a AVG i(Vclampheld) from=${fromS} to=${toS}\n.tran `,
  );
}

/** One output held by {@link holdOutputs}: its number (1 for the first) and voltage. */
export interface HeldOutput {
  output: number;
  heldV: number;
}

/**
 * An ngspice deck with each of `held` outputs held at its voltage (its output capacitor a
 * voltage source, its load gone), and ngspice's mean inductor current of each over [fromS, toS]
 * measured as `delivered_<k>_a`. With several outputs every output is held, so that each
 * output's settled voltage is found as one output's is (`holdFirstOutput`), the others at
 * theirs.
 */
export function holdOutputs(
  deck: string,
  held: readonly HeldOutput[],
  fromS: number,
  toS: number,
): string {
  let out = deck;
  for (const { output: k, heldV } of held) {
    out = out
      .replace(new RegExp(`^Cout${k} (\\S+) (\\S+) .*$`, 'm'), (_line, a: string, b: string) => {
        return `Vheld${k} ${a} ${b} DC ${heldV}`;
      })
      .replace(new RegExp(`^Rload${k} .*$`, 'm'), '')
      .replace(
        /^\.tran /m,
        `.meas tran delivered_${k}_a AVG i(Lout${k}) from=${fromS} to=${toS}\n.tran `,
      );
  }
  return out;
}

/**
 * The trials of {@link settledHeldOutputs} for `count` held outputs, as offsets relative to the
 * engine's voltages: first all at the engine's, then each output `step` below and above it in
 * turn (the others at the engine's), 2·count + 1 in all.
 */
export function heldOutputTrials(count: number, step: number): number[][] {
  const trials = [new Array<number>(count).fill(0)];
  for (let k = 0; k < count; k++) {
    for (const offset of [-step, step]) {
      const trial = new Array<number>(count).fill(0);
      trial[k] = offset;
      trials.push(trial);
    }
  }
  return trials;
}

/**
 * The second round of one-sided trials, after a first run at the engine's voltages: each output
 * `step` toward where its own excess (`excessAtEngineA[k]`, its mean inductor current less its
 * load's current there) vanishes, above where it delivers more than its load and below where it
 * delivers less, the others at the engine's; `count` runs instead of the central differences'
 * 2·count. The first round's trial (all zero) comes first in what {@link settledHeldOutputs} takes.
 */
export function towardSettledTrials(excessAtEngineA: readonly number[], step: number): number[][] {
  return excessAtEngineA.map((excess, k) => {
    const trial = new Array<number>(excessAtEngineA.length).fill(0);
    trial[k] = excess > 0 ? step : -step;
    return trial;
  });
}

/** The excess of output k in every trial: its mean inductor current less its load's current, A. */
export function heldOutputExcessA(
  engineV: readonly number[],
  loadOhm: readonly number[],
  trials: readonly (readonly number[])[],
  deliveredA: readonly (readonly number[])[],
): number[][] {
  return trials.map((offsets, t) =>
    engineV.map(
      (v, k) => (deliveredA[t]?.[k] ?? NaN) - (v * (1 + (offsets[k] ?? NaN))) / (loadOhm[k] ?? NaN),
    ),
  );
}

/** What {@link settledHeldOutputs} finds from the held runs. */
export interface SettledHeldOutputs {
  /** Each output's settled voltage, V: where every delivered current meets its load. */
  settledV: number[];
  /**
   * Per output, whether it delivers more than its load at its lowest trial voltage and less at
   * its highest (the others at the engine's): the root lies between the trials.
   */
  isBracketed: boolean[];
}

/**
 * The settled outputs of a deck run with every output held ({@link holdOutputs}) at `trials`
 * (offsets relative to the engine's voltages: the first all zero, then each output moved alone,
 * once ({@link towardSettledTrials}) or either side ({@link heldOutputTrials})): each output's
 * excess (its mean inductor current less the current its resistive load draws at the held
 * voltage) is linear near the settled point, so one Newton step from the engine's voltages on the
 * differences (central where both sides ran, else one-sided) finds where every excess is zero.
 * `deliveredA[t][k]` is output k's mean inductor current in trial t; `loadOhm[k]` its load.
 */
export function settledHeldOutputs(
  engineV: readonly number[],
  loadOhm: readonly number[],
  trials: readonly (readonly number[])[],
  deliveredA: readonly (readonly number[])[],
): SettledHeldOutputs {
  const count = engineV.length;
  const excess = heldOutputExcessA(engineV, loadOhm, trials, deliveredA);
  // Per output j, its own trials (j moved, the others at the engine's) by offset, the first run's
  // included: [offset, trial index].
  const own = engineV.map((_v, j) =>
    trials
      .map((offsets, t) => [offsets[j] ?? NaN, t] as const)
      .filter(([, t]) => (trials[t] ?? []).every((o, i) => i === j || o === 0))
      .sort((a, b) => a[0] - b[0]),
  );
  const at = (t: number, k: number): number => excess[t]?.[k] ?? NaN;
  const slope = (k: number, j: number): number => {
    const ownJ = own[j] ?? [];
    const low = ownJ[0] ?? [NaN, -1];
    const high = ownJ[ownJ.length - 1] ?? [NaN, -1];
    return (at(high[1], k) - at(low[1], k)) / ((high[0] - low[0]) * (engineV[j] ?? NaN));
  };
  // Rows: [∂excess_k/∂V_j for every j | −excess_k at the engine's voltages].
  const rows = engineV.map((_v, k) => [...engineV.map((_vj, j) => slope(k, j)), -at(0, k)]);
  // Gaussian elimination with partial pivoting.
  for (let i = 0; i < count; i++) {
    let pivot = i;
    for (let r = i + 1; r < count; r++) {
      if (Math.abs(rows[r]?.[i] ?? 0) > Math.abs(rows[pivot]?.[i] ?? 0)) pivot = r;
    }
    [rows[i], rows[pivot]] = [rows[pivot] as number[], rows[i] as number[]];
    const top = rows[i] as number[];
    for (let r = i + 1; r < count; r++) {
      const row = rows[r] as number[];
      const factor = (row[i] ?? NaN) / (top[i] ?? NaN);
      for (let c = i; c <= count; c++) row[c] = (row[c] ?? NaN) - factor * (top[c] ?? NaN);
    }
  }
  const dv = new Array<number>(count).fill(0);
  for (let i = count - 1; i >= 0; i--) {
    const row = rows[i] as number[];
    let sum = row[count] ?? NaN;
    for (let c = i + 1; c < count; c++) sum -= (row[c] ?? NaN) * (dv[c] ?? NaN);
    dv[i] = sum / (row[i] ?? NaN);
  }
  return {
    settledV: engineV.map((v, k) => v + (dv[k] ?? NaN)),
    isBracketed: engineV.map((_v, k) => {
      const ownK = own[k] ?? [];
      const low = ownK[0]?.[1] ?? -1;
      const high = ownK[ownK.length - 1]?.[1] ?? -1;
      return at(low, k) > 0 && at(high, k) < 0;
    }),
  };
}
