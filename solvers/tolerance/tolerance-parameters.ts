import type { Spec } from '../spec/spec-schema.js';
import type { Distribution } from './tolerance-distribution.js';

/**
 * The uncertain quantities of a tolerance run: what each one is, where it enters the unit's spec,
 * its nominal value and the spread it gets when the request names none. Ids are spec paths
 * (dot-separated) where the quantity is a spec field, else a plain name for an operating
 * condition.
 */

/** A spec being perturbed for one unit: the parts a parameter writes are copies. */
export type UnitSpecDraft = Spec & {
  outputs: (Spec['outputs'][number] & { rectifier: Spec['outputs'][number]['rectifier'] })[];
};

/** One uncertain quantity, before its distribution is chosen. */
export interface ParameterDefinition {
  id: string;
  /** What it is, in words. */
  label: string;
  /** Unit of its values: V, A, Ω, F, H, Hz, °C or 1 (dimensionless). */
  unit: string;
  /** The frozen design's value: the centre of its spread (a fixed parameter's run uses its value). */
  nominal: number;
  /** The spread when the request names none. */
  defaultDistribution: Distribution;
  /** Why that default, and whether it is common practice. */
  defaultBasis: string;
  /** Writes `value` into the unit's spec draft. */
  apply(draft: UnitSpecDraft, value: number): void;
}

const relativeUniform = (fraction: number): Distribution => ({
  kind: 'uniform',
  scale: 'relative',
  lower: -fraction,
  upper: fraction,
});

/** How the frozen design's magnetizing inductance is set, for its default spread. */
export interface MagnetizingInductanceBasis {
  /** 'set-inductance': a gapped core cut for Lm; 'ungapped': Lm is what the core gives. */
  gapRole: 'set-inductance' | 'ungapped' | undefined;
  /** The core material's relative μi tolerance, when the transformer is designed. */
  permeabilityTolerance: number | undefined;
}

/** Relative Lm spread of a gapped core: ±10 % (common practice: the gap dominates the reluctance). */
export const GAPPED_INDUCTANCE_TOLERANCE = 0.1;
/** Relative Lm spread of an ungapped ferrite core of unknown material: ±25 % (common practice). */
export const UNGAPPED_INDUCTANCE_TOLERANCE = 0.25;

/** Every parameter id a spec has (in the order the run draws them). */
export function toleranceParameterIds(spec: Spec): string[] {
  return parameterShapes(spec).map((shape) => shape.id);
}

interface ParameterShape {
  id: string;
  label: string;
  unit: string;
}

function parameterShapes(spec: Spec): ParameterShape[] {
  const shapes: ParameterShape[] = [
    { id: 'inputVoltageV', label: 'input voltage (operating condition)', unit: 'V' },
    {
      id: 'loadFraction',
      label: 'load as a fraction of full load (operating condition)',
      unit: '1',
    },
    {
      id: 'regulationSetpoint',
      label: 'regulated output set point (reference and divider accuracy), V',
      unit: 'V',
    },
    { id: 'switchingFrequencyHz', label: 'switching frequency (oscillator)', unit: 'Hz' },
    { id: 'ambientTemperatureC', label: 'ambient temperature', unit: '°C' },
    { id: 'transformer.magnetizingInductanceH', label: 'magnetizing inductance', unit: 'H' },
    { id: 'transformer.leakageInductanceH', label: 'leakage inductance', unit: 'H' },
    { id: 'primarySwitch.onResistanceOhm', label: 'primary switch on-resistance', unit: 'Ω' },
  ];
  spec.outputs.forEach((output, k) => {
    shapes.push(
      output.rectifier.kind === 'diode'
        ? {
            id: `outputs.${k}.rectifier.forwardVoltageV`,
            label: `output ${k + 1} rectifier forward drop`,
            unit: 'V',
          }
        : {
            id: `outputs.${k}.rectifier.onResistanceOhm`,
            label: `output ${k + 1} synchronous rectifier on-resistance`,
            unit: 'Ω',
          },
      { id: `outputs.${k}.capacitanceF`, label: `output ${k + 1} capacitance`, unit: 'F' },
      { id: `outputs.${k}.capacitorEsrOhm`, label: `output ${k + 1} capacitor ESR`, unit: 'Ω' },
    );
  });
  return shapes;
}

/**
 * The parameters of a frozen design's pinned spec, with their nominal values and default spreads.
 * `pinned` carries every choice (turns, Lm, leakage …) as spec fields.
 */
export function parameterDefinitions(
  pinned: Spec,
  lm: MagnetizingInductanceBasis,
): ParameterDefinition[] {
  const byId = new Map<string, Omit<ParameterDefinition, keyof ParameterShape>>();
  const lowestLoad = Math.min(...pinned.loadFractions);
  const highestLoad = Math.max(...pinned.loadFractions);
  byId.set('inputVoltageV', {
    nominal: pinned.inputVoltageNominalV,
    defaultDistribution: {
      kind: 'uniform',
      scale: 'absolute',
      lower: pinned.inputVoltageMinV,
      upper: pinned.inputVoltageMaxV,
    },
    defaultBasis: "the spec's input range, every voltage in it equally likely",
    apply: (draft, value) => {
      // The unit is solved at this one input: the spec's three input voltages all take it.
      draft.inputVoltageMinV = value;
      draft.inputVoltageNominalV = value;
      draft.inputVoltageMaxV = value;
    },
  });
  byId.set('loadFraction', {
    nominal: highestLoad,
    defaultDistribution: {
      kind: 'uniform',
      scale: 'absolute',
      lower: lowestLoad,
      upper: highestLoad,
    },
    defaultBasis: "the spec's load fractions, from the lightest to the heaviest, equally likely",
    apply: (draft, value) => {
      // The unit is solved at full load of a spec whose currents are scaled to this load.
      draft.outputs.forEach((output) => {
        output.currentA *= value;
      });
    },
  });
  const regulated = pinned.outputs[0];
  if (regulated === undefined) throw new RangeError('parameterDefinitions: no outputs');
  byId.set('regulationSetpoint', {
    nominal: regulated.voltageV,
    defaultDistribution: relativeUniform(0.01),
    defaultBasis:
      'common practice: ±1 % for a precision shunt reference with 0.1 % divider resistors (recalled)',
    apply: (draft, value) => {
      (draft.outputs[0] as UnitSpecDraft['outputs'][number]).voltageV = value;
    },
  });
  byId.set('switchingFrequencyHz', {
    nominal: pinned.switchingFrequencyHz,
    defaultDistribution: relativeUniform(0.05),
    defaultBasis: "common practice: ±5 % for a controller's internal oscillator (recalled)",
    apply: (draft, value) => {
      draft.switchingFrequencyHz = value;
    },
  });
  const ambientC = pinned.ambientTemperatureC;
  const copperC = pinned.transformer.copperTemperatureC;
  byId.set('ambientTemperatureC', {
    nominal: ambientC,
    defaultDistribution: {
      kind: 'uniform',
      scale: 'absolute',
      lower: ambientC - 10,
      upper: ambientC + 10,
    },
    defaultBasis:
      "a placeholder of ±10 K about the spec's ambient, not a standard figure: set the product's rated ambient range",
    apply: (draft, value) => {
      draft.ambientTemperatureC = value;
      // A winding temperature fixed by the transformer design moves with the ambient.
      if (copperC !== undefined) {
        draft.transformer.copperTemperatureC = copperC + (value - ambientC);
      }
    },
  });
  const lmTolerance =
    lm.gapRole === 'set-inductance'
      ? GAPPED_INDUCTANCE_TOLERANCE
      : (lm.permeabilityTolerance ?? UNGAPPED_INDUCTANCE_TOLERANCE);
  byId.set('transformer.magnetizingInductanceH', {
    nominal: required(pinned.transformer.magnetizingInductanceH, 'magnetizingInductanceH'),
    defaultDistribution: relativeUniform(lmTolerance),
    defaultBasis:
      lm.gapRole === 'set-inductance'
        ? 'common practice: ±10 % for a gapped core, whose gap sets the inductance'
        : lm.permeabilityTolerance !== undefined
          ? "the core material's initial-permeability tolerance (an ungapped core's inductance is proportional to it)"
          : 'common practice: ±25 % for an ungapped ferrite core (the usual initial-permeability tolerance)',
    apply: (draft, value) => {
      draft.transformer.magnetizingInductanceH = value;
    },
  });
  byId.set('transformer.leakageInductanceH', {
    nominal: required(pinned.transformer.leakageInductanceH, 'leakageInductanceH'),
    defaultDistribution: relativeUniform(0.2),
    defaultBasis: 'common practice: ±20 % between builds of one winding (recalled)',
    apply: (draft, value) => {
      draft.transformer.leakageInductanceH = value;
    },
  });
  byId.set('primarySwitch.onResistanceOhm', {
    nominal: pinned.primarySwitch.onResistanceOhm,
    defaultDistribution: relativeUniform(0.2),
    defaultBasis:
      'common practice: ±20 % part-to-part about the typical on-resistance (recalled); its temperature rise is not modelled',
    apply: (draft, value) => {
      draft.primarySwitch.onResistanceOhm = value;
    },
  });
  pinned.outputs.forEach((output, k) => {
    const outputOf = (draft: UnitSpecDraft) => draft.outputs[k] as UnitSpecDraft['outputs'][number];
    const rectifier = output.rectifier;
    if (rectifier.kind === 'diode') {
      byId.set(`outputs.${k}.rectifier.forwardVoltageV`, {
        nominal: rectifier.forwardVoltageV,
        defaultDistribution: relativeUniform(0.1),
        defaultBasis: 'common practice: ±10 % part-to-part on a diode forward drop (recalled)',
        apply: (draft, value) => {
          const target = outputOf(draft).rectifier;
          if (target.kind === 'diode') target.forwardVoltageV = value;
        },
      });
    } else {
      byId.set(`outputs.${k}.rectifier.onResistanceOhm`, {
        nominal: rectifier.onResistanceOhm,
        defaultDistribution: relativeUniform(0.2),
        defaultBasis:
          'common practice: ±20 % part-to-part about the typical on-resistance (recalled)',
        apply: (draft, value) => {
          const target = outputOf(draft).rectifier;
          if (target.kind === 'synchronous') target.onResistanceOhm = value;
        },
      });
    }
    byId.set(`outputs.${k}.capacitanceF`, {
      nominal: output.capacitanceF,
      defaultDistribution: relativeUniform(0.2),
      defaultBasis:
        'IEC 60062 tolerance code M (±20 %), usual for electrolytic and polymer capacitors',
      apply: (draft, value) => {
        outputOf(draft).capacitanceF = value;
      },
    });
    byId.set(`outputs.${k}.capacitorEsrOhm`, {
      nominal: output.capacitorEsrOhm,
      defaultDistribution: relativeUniform(0.3),
      defaultBasis:
        "a placeholder of ±30 %, not a standard figure: ESR spreads widely and rises with cold and age; use the part's figures",
      apply: (draft, value) => {
        outputOf(draft).capacitorEsrOhm = value;
      },
    });
  });
  return parameterShapes(pinned).map((shape) => {
    const rest = byId.get(shape.id);
    if (rest === undefined) throw new Error(`parameterDefinitions: no definition for ${shape.id}`);
    return { ...shape, ...rest };
  });
}

function required(value: number | undefined, name: string): number {
  if (value === undefined) throw new Error(`parameterDefinitions: the pinned spec lacks ${name}`);
  return value;
}

/** A copy of `spec` whose parts the parameters write are fresh objects. */
export function unitSpecDraft(spec: Spec): UnitSpecDraft {
  return {
    ...spec,
    outputs: spec.outputs.map((output) => ({ ...output, rectifier: { ...output.rectifier } })),
    transformer: { ...spec.transformer },
    primarySwitch: { ...spec.primarySwitch },
  };
}
