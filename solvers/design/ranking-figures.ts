import type { Spec } from '../spec/spec-schema.js';
import type { Design } from './design-schema.js';

/** The figures a topology comparison can rank by; stable kebab-case names clients may send. */
export const RANKING_FIGURE_IDS = [
  'efficiency-nominal',
  'efficiency-lowest',
  'loss-largest',
  'switch-voltage-utilization',
  'switch-current-peak',
] as const;

export type RankingFigureId = (typeof RANKING_FIGURE_IDS)[number];

/** Which way a figure ranks: the better design has the higher or the lower value. */
export type RankingOrder = 'higher-first' | 'lower-first';

/** How one ranking figure reads a design, which way it ranks, and in which unit. */
export interface RankingFigure {
  order: RankingOrder;
  /** The unit of the value: '1' for a dimensionless fraction. */
  unit: '1' | 'W' | 'A';
  /** What the value is, in a sentence. */
  description: string;
  value(design: Design, spec: Spec): number;
}

/**
 * The ranking figures by name, each read from the design's summary: efficiencies rank higher
 * first, losses and stresses lower first.
 */
export const RANKING_FIGURES: Readonly<Record<RankingFigureId, RankingFigure>> = {
  'efficiency-nominal': {
    order: 'higher-first',
    unit: '1',
    description:
      'efficiency at nominal input and the largest load point (summary.efficiencyNominal)',
    value: (design) => design.summary.efficiencyNominal,
  },
  'efficiency-lowest': {
    order: 'higher-first',
    unit: '1',
    description: 'lowest efficiency over all corners (summary.efficiencyMin)',
    value: (design) => design.summary.efficiencyMin,
  },
  'loss-largest': {
    order: 'lower-first',
    unit: 'W',
    description: 'largest total loss over all corners, W (summary.lossTotalMaxW)',
    value: (design) => design.summary.lossTotalMaxW,
  },
  'switch-voltage-utilization': {
    order: 'lower-first',
    unit: '1',
    description:
      'largest primary switch peak voltage over its rating (summary.switchVoltagePeakV / primarySwitch.voltageRatingV)',
    value: (design, spec) => design.summary.switchVoltagePeakV / spec.primarySwitch.voltageRatingV,
  },
  'switch-current-peak': {
    order: 'lower-first',
    unit: 'A',
    description:
      'largest primary switch peak current over all corners, A (summary.switchCurrentPeakA)',
    value: (design) => design.summary.switchCurrentPeakA,
  },
};
