import type { FlybackDesign, Loss } from '../../design/design-schema.js';
import { bodyDiodeDeadTimeLoss } from '../../losses/body-diode-dead-time-loss.js';
import { diodeConductionLoss } from '../../losses/diode-conduction-loss.js';
import { gateDriveLoss } from '../../losses/gate-drive-loss.js';
import { outputCapacitanceLoss } from '../../losses/output-capacitance-loss.js';
import { rcdClampLoss } from '../../losses/rcd-clamp-loss.js';
import { resistiveLoss } from '../../losses/resistive-loss.js';
import { reverseRecoveryLoss } from '../../losses/reverse-recovery-loss.js';
import { switchingOverlapLoss } from '../../losses/switching-overlap-loss.js';
import type { Spec } from '../../spec/spec-schema.js';
import type { FlybackCircuit } from './flyback-circuit.js';
import type { FlybackCurrentStats } from './flyback-current-stats.js';
import type { FlybackSteadyState } from './flyback-steady-state.js';

/**
 * Returns the loss budget of one corner, W per component and mechanism, in a fixed order:
 * switch, rectifiers, windings, clamp, leakage ring. Conduction and copper losses read RMS and average currents
 * from the waveforms; edge losses use the voltage and current the model gives at each edge.
 */
export function flybackLosses(
  spec: Spec,
  choices: FlybackDesign['choices'],
  circuit: FlybackCircuit,
  state: FlybackSteadyState,
  stats: FlybackCurrentStats,
  outputVoltagesV: readonly number[],
): Loss[] {
  const fs = spec.switchingFrequencyHz;
  const device = spec.primarySwitch;
  const vin = circuit.inputVoltageV;
  const llk = circuit.leakageInductanceH;
  const valley = state.valleyCurrentA;
  const isContinuous = state.mode !== 'dcm' && valley > 0;
  // Turn-on: CCM and BCM at Vin + reflected voltage; DCM at the drain voltage the idle ring
  // (flyback-idle-ring.ts) has reached, with the ring's current I0: overlap loss only when I0 is
  // positive (a negative I0 flows out of the drain and discharges it, as in a valley turn-on).
  const turnOnV =
    state.mode === 'dcm'
      ? state.turnOnDrainV
      : vin + circuit.reflectedOffsetV + circuit.reflectedResistanceOhm * valley;
  const turnOnA = isContinuous ? valley : state.mode === 'dcm' ? Math.max(0, valley) : 0;
  // Turn-off: the clamp holds the drain at Vin + Vc while the leakage current commutates; with
  // drain capacitance the leakage ring may peak below it (flyback-turn-off.ts).
  const hasRing = state.leakageRingS > 0;
  const turnOffV = hasRing
    ? Math.min(vin + circuit.clampVoltageV, vin + state.turnOffReflectedV + state.leakageRingPeakV)
    : llk > 0
      ? vin + circuit.clampVoltageV
      : vin + circuit.reflectedOffsetV + circuit.reflectedResistanceOhm * state.peakCurrentA;
  const losses: Loss[] = [
    loss('primary-switch', 'conduction', resistiveLoss(stats.switchA.rmsA, device.onResistanceOhm)),
    loss('primary-switch', 'turn-on', switchingOverlapLoss(turnOnV, turnOnA, device.riseTimeS, fs)),
    loss(
      'primary-switch',
      'turn-off',
      switchingOverlapLoss(turnOffV, state.peakCurrentA, device.fallTimeS, fs),
    ),
    loss(
      'primary-switch',
      'output-capacitance',
      outputCapacitanceLoss(device.outputCapacitanceF, turnOnV, fs),
    ),
    loss(
      'primary-switch',
      'gate-drive',
      gateDriveLoss(device.gateChargeC, device.gateDriveVoltageV, fs),
    ),
  ];
  const magnetizingShare = circuit.magnetizingInductanceH / (circuit.magnetizingInductanceH + llk);
  spec.outputs.forEach((output, k) => {
    const path = circuit.outputs[k];
    const secondaryA = stats.secondariesA[k];
    if (path === undefined || secondaryA === undefined) return;
    const component = `rectifier-${k + 1}`;
    const meanA = secondaryA.averageA;
    const rmsA = secondaryA.rmsA;
    const rectifier = output.rectifier;
    if (rectifier.kind === 'diode') {
      losses.push(
        loss(
          component,
          'conduction',
          diodeConductionLoss(rectifier.forwardVoltageV, rectifier.resistanceOhm, meanA, rmsA),
        ),
      );
      // Recovery only in CCM: in DCM the diode current decays to zero at the slow demagnetizing
      // slope and its charge is gone before the switch applies the reverse voltage.
      const reverseV =
        (outputVoltagesV[k] ?? 0) +
        (magnetizingShare * (vin - circuit.primaryLoopResistanceOhm * state.onsetCurrentA)) /
          path.turnsRatio;
      const recoveryW = isContinuous
        ? reverseRecoveryLoss(rectifier.reverseRecoveryChargeC, reverseV, fs)
        : 0;
      losses.push(loss(component, 'reverse-recovery', recoveryW));
    } else {
      losses.push(loss(component, 'conduction', resistiveLoss(rmsA, rectifier.onResistanceOhm)));
      losses.push(
        loss(
          component,
          'gate-drive',
          gateDriveLoss(rectifier.gateChargeC, rectifier.gateDriveVoltageV, fs),
        ),
      );
      // Half the dead time at each edge: after the turn-off commutation (current αk·Ib) and
      // before the next turn-on (αk·Iv in CCM, zero in DCM).
      const edgeMeanA =
        (path.currentShare * (state.afterCommutationCurrentA + (isContinuous ? valley : 0))) / 2;
      losses.push(
        loss(
          component,
          'dead-time',
          bodyDiodeDeadTimeLoss(
            rectifier.bodyDiodeForwardVoltageV,
            edgeMeanA,
            rectifier.deadTimeS,
            fs,
          ),
        ),
      );
    }
  });
  losses.push(
    loss(
      'primary',
      'copper',
      resistiveLoss(stats.primaryWindingA.rmsA, choices.primaryResistanceOhm),
    ),
  );
  stats.secondariesA.forEach((secondaryA, k) => {
    const path = circuit.outputs[k];
    if (path === undefined) return;
    losses.push(
      loss(
        `secondary-${k + 1}`,
        'copper',
        resistiveLoss(secondaryA.rmsA, path.windingResistanceOhm),
      ),
    );
    // The capacitor carries the rectifier current's AC part: I²rms − Io² (charge balance).
    const rippleSquareA2 = Math.max(0, secondaryA.rmsA ** 2 - path.currentA ** 2);
    losses.push(loss(`output-capacitor-${k + 1}`, 'esr', path.capacitorEsrOhm * rippleSquareA2));
  });
  const clampW =
    llk > 0 && state.peakCurrentA > 0
      ? // The leakage carries the current the drain's rise and the leakage ring leave when the
        // clamp takes over (flyback-turn-off.ts); zero when the ring peaks below the clamp.
        rcdClampLoss(
          llk,
          state.clampOnsetCurrentA,
          circuit.clampVoltageV,
          state.turnOffReflectedV,
          fs,
        )
      : 0;
  losses.push(loss('clamp', 'clamp', clampW));
  // The energy the leakage ring leaves in the drain capacitance above the ring's centre,
  // ½·C·u_pk² a period, which its damping dissipates (energy of a capacitor; common practice).
  const ringW = hasRing ? 0.5 * circuit.drainCapacitanceF * state.leakageRingPeakV ** 2 * fs : 0;
  losses.push(loss('leakage-ring', 'output-capacitance', ringW));
  return losses;
}

function loss(component: string, mechanism: Loss['mechanism'], powerW: number): Loss {
  return { component, mechanism, powerW };
}
