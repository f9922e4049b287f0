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
