import { z } from 'zod';
import { HoldUpSchema } from './hold-up-schema.js';
import { MagneticsSpecSchema } from './magnetics-spec-schema.js';
import { checkSpecConsistency } from './spec-consistency.js';

/**
 * The converter specification: what the engine is asked to design. Every numeric field is in SI
 * base units (temperatures in degrees Celsius) and says so in its description; the OpenAPI
 * document is generated from this schema. Defaults are applied at parse time and echoed back in
 * every design, so each assumption is visible.
 */

const positive = (description: string) => z.number().positive().describe(description);
const nonNegative = (description: string) => z.number().nonnegative().describe(description);
const fraction = (description: string) => z.number().gt(0).lt(1).describe(description);

export const PrimarySwitchSchema = z
  .strictObject({
    onResistanceOhm: positive('Drain-source on-resistance at operating temperature, Ω.'),
    voltageRatingV: positive('Drain-source voltage rating, V.'),
    outputCapacitanceF: nonNegative(
      'Energy-equivalent output capacitance, F: E = ½·C·V² at turn-on is dissipated.',
    ).default(100e-12),
    riseTimeS: nonNegative('Current rise / voltage fall time at turn-on, s.').default(20e-9),
    fallTimeS: nonNegative('Voltage rise / current fall time at turn-off, s.').default(20e-9),
    gateChargeC: nonNegative('Total gate charge at the drive voltage, C.').default(20e-9),
    gateDriveVoltageV: positive('Gate drive voltage, V.').default(12),
    bodyDiodeForwardVoltageV: nonNegative(
      'Forward drop of the body diode (or reverse conduction) at the switch current, V: in the ' +
        "active clamp's dead times and where a bridge's leakage current returns through the " +
        'opposite switches. The default is a silicon body diode (common practice); a ' +
        'wide-bandgap switch conducting in reverse drops more.',
    ).default(0.8),
  })
  .describe('The primary power switch (a MOSFET-class device).');

export const DiodeRectifierSchema = z.strictObject({
  kind: z.literal('diode'),
  forwardVoltageV: nonNegative('Forward-voltage intercept of the linear diode model, V.'),
  resistanceOhm: nonNegative('Slope resistance of the linear diode model, Ω.').default(0),
  voltageRatingV: positive('Repetitive reverse voltage rating, V.').optional(),
  reverseRecoveryChargeC: nonNegative(
    'Reverse-recovery charge, C (0 for a Schottky-class diode).',
  ).default(0),
});

export const SynchronousRectifierSchema = z.strictObject({
  kind: z.literal('synchronous'),
  onResistanceOhm: positive(
    'On-resistance of the synchronous rectifier at operating temperature, Ω.',
  ),
  voltageRatingV: positive('Drain-source voltage rating, V.').optional(),
  gateChargeC: nonNegative('Total gate charge at the drive voltage, C.').default(20e-9),
  gateDriveVoltageV: positive('Gate drive voltage, V.').default(10),
  bodyDiodeForwardVoltageV: nonNegative('Body-diode forward voltage during dead time, V.').default(
    0.8,
  ),
  deadTimeS: nonNegative('Total body-diode conduction time per period (both edges), s.').default(
    50e-9,
  ),
});

export const RectifierSchema = z
  .discriminatedUnion('kind', [DiodeRectifierSchema, SynchronousRectifierSchema])
  .describe('The output rectifier: a diode (linear model) or a synchronous rectifier.');

export const OutputSchema = z.strictObject({
  name: z.string().min(1).max(40).optional().describe('A label for the output.'),
  voltageV: positive('Regulated output voltage at the load, V.'),
  currentA: positive('Full-load output current, A.'),
  rectifier: RectifierSchema,
  windingResistanceOhm: nonNegative(
    'DC resistance of this output winding at 20 °C, Ω; scaled to the ambient by IEC 60028.',
  ).default(0.005),
  capacitanceF: positive('Output capacitance, F.').default(470e-6),
  capacitorEsrOhm: nonNegative('Equivalent series resistance of the output capacitor, Ω.').default(
    0.02,
  ),
  inductanceH: positive(
    'Output filter inductance of a buck-derived topology (forward family), H; chosen from outputInductorRippleRatioTarget when omitted. Not used by the flyback.',
  ).optional(),
  inductorResistanceOhm: nonNegative(
    'DC resistance of the output filter inductor at 20 °C (forward family), Ω; scaled to the ambient by IEC 60028. Not used by the flyback.',
  ).optional(),
  secondaryArrangement: z
    .enum(['center-tapped', 'full-bridge'])
    .optional()
    .describe(
      "Push-pull, half-bridge and full-bridge only: a center-tapped secondary with two rectifiers (each blocks about twice the secondary voltage; windingResistanceOhm is each half's) or one winding into a full-bridge rectifier (four rectifiers, two in series, each blocks the secondary voltage); 'center-tapped' when omitted (common practice for low output voltages).",
    ),
});

export const TransformerSchema = z
  .strictObject({
    turnsRatio: positive(
      'Primary-to-first-output turns ratio Np/Ns (dimensionless); chosen from dutyCycleTarget when omitted.',
    ).optional(),
    magnetizingInductanceH: positive(
      'Magnetizing inductance referred to the primary, H; chosen from magnetizingRippleRatioTarget when omitted.',
    ).optional(),
    leakageInductanceH: nonNegative(
      'Primary-referred leakage inductance, H; leakageInductanceFraction × Lm when omitted.',
    ).optional(),
    leakageInductanceFraction: z
      .number()
      .min(0)
      .lt(0.5)
      .default(0.01)
      .describe(
        'Leakage as a fraction of the magnetizing inductance, used when leakageInductanceH is omitted.',
      ),
    primaryResistanceOhm: nonNegative(
      'DC resistance of the primary winding at 20 °C, Ω; scaled to the ambient by IEC 60028.',
    ).default(0.05),
    outputTurnsRatios: z
      .array(z.number().positive())
      .min(1)
      .max(4)
      .optional()
      .describe(
        'Primary-to-output turns ratio Np/Ns of every output (dimensionless), when fixed; the first equals turnsRatio. Omitted: the further outputs are chosen for their voltages.',
      ),
    copperTemperatureC: z
      .number()
      .min(-55)
      .max(250)
      .optional()
      .describe(
        'Temperature the winding resistances are taken at, °C; the ambient when omitted. The magnetics design sets it to the hottest corner of the wound transformer.',
      ),
  })
  .default({ leakageInductanceFraction: 0.01, primaryResistanceOhm: 0.05 })
  .describe('Transformer choices; anything omitted is chosen by the engine from the targets.');

export const ClampSchema = z
  .strictObject({
    voltageV: positive(
      'Voltage across the clamp capacitor (above the input rail), V; voltageToReflectedRatio × reflected voltage when omitted (push-pull: × the highest input voltage, which the other primary half’s voltage does not exceed).',
    ).optional(),
    voltageToReflectedRatio: z
      .number()
      .gt(1)
      .max(5)
      .default(1.5)
      .describe(
        'Clamp voltage as a multiple of the reflected output voltage (dimensionless, > 1); for the push-pull, of the highest input voltage (the other primary half’s voltage, which the off switch’s drain sits above the rail while the other half is driven).',
      ),
  })
  .default({ voltageToReflectedRatio: 1.5 })
  .describe(
    'The RCD clamp: across the flyback’s primary, and from each drain of a push-pull with leakage (a diode from each drain to one capacitor held this voltage above the input rail, discharged into the rail by a resistor); not used by the other topologies.',
  );

export const PrimaryClampDiodeSchema = z
  .strictObject({
    forwardVoltageV: nonNegative(
      'Forward drop of each clamp or reset diode, V (default 0.8).',
    ).default(0.8),
  })
  .describe(
    'The diodes that return the magnetizing energy to the input: both clamp diodes of a two-switch forward, or the reset-winding diode of a forward with a reset winding; not used by the flyback.',
  );

export const ForwardSchema = z
  .strictObject({
    resetTurnsRatio: z
      .number()
      .min(0.05)
      .max(20)
      .describe(
        'Reset-to-primary turns ratio Nr/Np of a forward with a reset winding (dimensionless), 0.05 to 20 (a winding beyond either end cannot be wound against the primary); 1 when omitted, which limits the duty cycle to 0.5.',
      )
      .optional(),
  })
  .describe('Choices of the forward with a reset winding; not used by other topologies.');

export const ActiveClampSchema = z
  .strictObject({
    capacitanceF: positive(
      'Clamp capacitance of an active-clamp forward, F; chosen for a peak-to-peak clamp voltage ripple of 0.05 of its mean at the highest input and full load when omitted.',
    ).optional(),
    capacitorEsrOhm: nonNegative(
      'Equivalent series resistance of the clamp capacitor, Ω; 0.01 when omitted.',
    ).optional(),
    deadTimeS: nonNegative(
      'Delay between one switch turning off and the other turning on, at each of the two edges, s; 100e-9 when omitted.',
    ).optional(),
    auxiliarySwitch: PrimarySwitchSchema.optional().describe(
      'The auxiliary (clamp) switch; the same device as primarySwitch when omitted.',
    ),
  })
  .describe(
    'The active clamp of an active-clamp forward (auxiliary switch and clamp capacitor across the primary winding); not used by other topologies.',
  );

export const TargetsSchema = z
  .strictObject({
    dutyCycleTarget: fraction(
      'Duty cycle aimed at, at the lowest input and full load, when the turns ratio is chosen (push-pull and bridges: each switch’s on-time over the period, at most 0.5).',
    ).default(0.45),
    magnetizingRippleRatioTarget: z
      .number()
      .gt(0)
      .max(2)
      .default(0.6)
      .describe(
        'Peak-to-peak magnetizing ripple over its average, at the lowest input and full load, when Lm is chosen (2 is the boundary of continuous conduction).',
      ),
    outputInductorRippleRatioTarget: z
      .number()
      .gt(0)
      .max(2)
      .optional()
      .describe(
        'Buck-derived topologies: peak-to-peak output inductor ripple over full-load current at the highest input, when an output inductance is chosen; 0.3 when omitted (common practice; 2 is the boundary of continuous conduction).',
      ),
  })
  .default({ dutyCycleTarget: 0.45, magnetizingRippleRatioTarget: 0.6 })
  .describe('Design targets the engine uses for every choice the request leaves open.');

export const LimitsSchema = z
  .strictObject({
    dutyCycleMax: fraction('Largest duty cycle the controller may command.').default(0.65),
    switchVoltageDerating: z
      .number()
      .gt(0)
      .max(1)
      .default(0.9)
      .describe('Largest allowed switch peak voltage as a fraction of its rating.'),
    rectifierVoltageDerating: z
      .number()
      .gt(0)
      .max(1)
      .default(0.9)
      .describe('Largest allowed rectifier reverse voltage as a fraction of its rating.'),
  })
  .default({ dutyCycleMax: 0.65, switchVoltageDerating: 0.9, rectifierVoltageDerating: 0.9 })
  .describe('Limits the design is held against.');

export const TOPOLOGY_IDS = [
  'flyback',
  'two-switch-forward',
  'forward-reset-winding',
  'active-clamp-forward',
  'push-pull',
  'half-bridge',
  'full-bridge',
] as const;

export const SpecSchema = z
  .strictObject({
    topology: z.enum(TOPOLOGY_IDS).describe('The converter topology.'),
    inputVoltageMinV: positive('Lowest input voltage, V.'),
    inputVoltageNominalV: positive('Nominal input voltage, V.'),
    inputVoltageMaxV: positive('Highest input voltage, V.'),
    outputs: z
      .array(OutputSchema)
      .min(1)
      .max(4)
      .describe('The outputs; the first is the regulated one.'),
    loadFractions: z
      .array(z.number().gt(0).max(1.5))
      .min(1)
      .max(6)
      .default([0.1, 0.5, 1])
      .describe('Load points as fractions of full load, applied to every output together.'),
    switchingFrequencyHz: z.number().min(1e3).max(10e6).describe('Switching frequency, Hz.'),
    ambientTemperatureC: z
      .number()
      .min(-55)
      .max(150)
      .default(25)
      .describe('Ambient temperature, °C.'),
    holdUp: HoldUpSchema.optional(),
    primarySwitch: PrimarySwitchSchema,
    transformer: TransformerSchema,
    clamp: ClampSchema,
    primaryClampDiode: PrimaryClampDiodeSchema.optional(),
    forward: ForwardSchema.optional(),
    activeClamp: ActiveClampSchema.optional(),
    targets: TargetsSchema,
    limits: LimitsSchema,
    magnetics: MagneticsSpecSchema,
  })
  .superRefine(checkSpecConsistency)
  .describe('A converter specification.');

/** A spec as the engine sees it: parsed, with every default filled in. */
export type Spec = z.infer<typeof SpecSchema>;
/** A spec as a client may send it: defaults optional. */
export type SpecInput = z.input<typeof SpecSchema>;
export type Rectifier = z.infer<typeof RectifierSchema>;
export type Output = z.infer<typeof OutputSchema>;
