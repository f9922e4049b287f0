/**
 * An ngspice deck with its first output held at `heldV` (the output capacitor becomes a voltage
 * source, the load goes) and ngspice's mean output-inductor current over [fromS, toS] measured as
 * `delivered_a`. At a few percent load an output settles over thousands of periods; holding it at
 * trial voltages and comparing the delivered current with the load each would draw finds the
 * settled output in some 100 periods (the root of the difference). Used by the light-load netlist
 * tests and `test/bench/light-load-probe.ts`.
 */
export function holdFirstOutput(deck: string, heldV: number, fromS: number, toS: number): string {
  return holdOutput(deck, 1, heldV, fromS, toS, 'delivered_a');
}

/**
 * {@link holdFirstOutput} for output `index` (1 the first), its mean inductor current measured
 * as `measure` (`delivered_<index>_a` unless given): with several outputs each is held at its
 * own trial voltage and the settled outputs are where every delivered current meets its load.
 */
export function holdOutput(
  deck: string,
  index: number,
  heldV: number,
  fromS: number,
  toS: number,
  measure = `delivered_${index}_a`,
): string {
  return deck
    .replace(new RegExp(`^Cout${index} (\\S+) (\\S+) .*$`, 'm'), (_line, a: string, b: string) => {
      return `Vheld${index} ${a} ${b} DC ${heldV}`;
    })
    .replace(new RegExp(`^Rload${index} .*$`, 'm'), '')
    .replace(
      /^\.tran /m,
      `.meas tran ${measure} AVG i(Lout${index}) from=${fromS} to=${toS}\n.tran `,
    );
}
