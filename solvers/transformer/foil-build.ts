import { currentSpectrum } from '../magnetics/winding-ac-resistance.js';
import { rms } from '../waveform/rms.js';
import type { Waveform } from '../waveform/waveform.js';
import { dutySpectra, spectrumAt } from './duty-spectra.js';
import {
  FOIL_WINDING_CHOICE_DEFAULTS,
  foilWindingChoice,
  type FoilWindingChoiceOptions,
} from './foil-winding-choice.js';
import type { TransformerBuild } from './transformer-build.js';
import type { TransformerDuty } from './transformer-duty.js';
import { transformerStack } from './transformer-stack.js';
import type { WindingWire } from './winding-wire.js';

/** Harmonics of a winding current the foil thickness is chosen over. */
const FOIL_HARMONIC_COUNT = 64;

/**
 * Returns `build` with foil in place of every litz winding of at most turnsMax turns, or
 * undefined when no winding qualifies or the build does not fit the breadth `breadthM` (m).
 * Common practice: past the few amperes where round wire turns to litz, a winding of few
 * turns is litz or foil. Each foil spans the breadth, one turn to a layer; its thickness is
 * {@link foilWindingChoice}'s over the winding's current at its largest-RMS corner and its own
 * Dowell layer count in this build's stack (which the thickness does not change: the count
 * follows from the turns and the ampere-turn shares). The design keeps whichever build loses less.
 */
export function foilBuild(
  duty: TransformerDuty,
  build: TransformerBuild,
  breadthM: number,
  sectionInsulationM: number,
  meanTurnLengthM: number,
  options: FoilWindingChoiceOptions = {},
): TransformerBuild | undefined {
  const settings = { ...FOIL_WINDING_CHOICE_DEFAULTS, ...options };
  const isFoil = build.wires.map(
    (wire, k) => wire.kind === 'litz' && (build.turns[k] ?? Infinity) <= settings.turnsMax,
  );
  if (!isFoil.includes(true)) return undefined;
  // Any thickness gives the layer counts; the thinnest keeps the provisional stack the smallest.
  const provisional: WindingWire = {
    kind: 'foil',
    thicknessM: Math.min(...settings.thicknessesM),
    widthM: breadthM,
    insulationThicknessM: settings.insulationThicknessM,
  };
  const laid = transformerStack(
    duty,
    { ...build, wires: build.wires.map((wire, k) => (isFoil[k] ? provisional : wire)) },
    breadthM,
    sectionInsulationM,
    meanTurnLengthM,
  );
  if (laid === undefined) return undefined;
  const wires = build.wires.map((wire, k): WindingWire => {
    const winding = duty.windings[k];
    if (!isFoil[k] || winding === undefined) return wire;
    // The corner of largest RMS current (the first of equals), each RMS taken once.
    let worstIndex = -1;
    let worstRmsA = 0;
    for (let index = 0; index < winding.currentsA.length; index++) {
      const rmsA = rms(winding.currentsA[index] as Waveform);
      if (worstIndex < 0 || rmsA > worstRmsA) {
        worstIndex = index;
        worstRmsA = rmsA;
      }
    }
    const worst = winding.currentsA[worstIndex];
    if (worst === undefined) return wire;
    // The evaluations' spectrum of that current when it holds exactly the harmonics chosen over
    // (the same numbers: a waveform's harmonics do not depend on how many are taken).
    const known = spectrumAt(dutySpectra(duty), worst, k, worstIndex, FOIL_HARMONIC_COUNT);
    return foilWindingChoice(
      known.harmonicSquaresA2.length === FOIL_HARMONIC_COUNT
        ? known
        : currentSpectrum(worst, FOIL_HARMONIC_COUNT),
      laid.equivalentLayerCounts[k] ?? 0.5,
      breadthM,
      settings,
    );
  });
  // Turns of its own: the evaluation keeps one laid stack per turns array.
  return { ...build, turns: [...build.turns], wires };
}
