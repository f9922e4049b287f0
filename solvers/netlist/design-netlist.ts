import type { Design } from '../design/design-schema.js';
import type { Spec } from '../spec/spec-schema.js';
import { activeClampForwardNetlist } from './active-clamp-forward-netlist.js';
import { doubleEndedNetlist } from './double-ended-netlist.js';
import { flybackNetlist, type FlybackNetlistOptions } from './flyback-netlist.js';
import type { SwitchedNetlistOptions } from './switched-netlist-options.js';
import { twoSwitchForwardNetlist } from './two-switch-forward-netlist.js';

/** Options of {@link designNetlist}: those of the topology's own netlist (each takes its own). */
export type DesignNetlistOptions = FlybackNetlistOptions & SwitchedNetlistOptions;

/**
 * Returns the SPICE netlist (ngspice text) of `design` at one corner, by its topology.
 * @throws RangeError for an unknown corner label or windows that do not fit the run.
 */
export function designNetlist(
  spec: Spec,
  design: Design,
  options: DesignNetlistOptions = {},
): string {
  switch (design.topology) {
    case 'flyback':
      return flybackNetlist(spec, design, options);
    case 'two-switch-forward':
    case 'forward-reset-winding':
      return twoSwitchForwardNetlist(spec, design, options);
    case 'active-clamp-forward':
      return activeClampForwardNetlist(spec, design, options);
    case 'push-pull':
    case 'half-bridge':
    case 'full-bridge':
      return doubleEndedNetlist(spec, design, options);
  }
}
