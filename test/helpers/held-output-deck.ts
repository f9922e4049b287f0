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
