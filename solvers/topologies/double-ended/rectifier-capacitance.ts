/**
 * The capacitance the push-pull's stepped half takes across each rectifier where its output
 * conducts continuously, F: 30 pF, the figure the double-ended decks' rectifier snubbers hold
 * there (`solvers/netlist/double-ended-output-lines.ts`, which reads it from here). An
 * assumption about the rectifier, not a part of the spec (which has no rectifier capacitance):
 * a real rectifier's junction holds tens of pF or more. Across a center-tapped output the
 * blocking rectifier's capacitance swings with 2·e/n and its current returns through both
 * halves, so referred to half a of the primary it adds 4·C/n² (a bridge's two blocking
 * rectifiers lie across the winding: 2·C/n²; n = Np/Ns). The engine takes it only where the
 * dead time is short (`push-pull-short-dead-time.ts`): there, as the winding collapses at a
 * turn-off, it slows the collapse and the turning-off drain's crest falls with it (seed 1's
 * spec 9 at 36 V, 20.4 % load, some 24 pF referred against the drains' 200 pF: ngspice read
 * 109.5 V with 30 pF and 116.4 V with 1 pF; DEVELOPERS.md, "The push-pull's short dead time").
 */
export const RECTIFIER_CAPACITANCE_F = 30e-12;
