/**
 * The caution every response carrying computed results repeats (product rule 5). One constant,
 * so the wording is the same in JSON bodies, the OpenAPI document and the README.
 */
export const CAUTION =
  'Results are engineering estimates that a qualified person must verify before use. ' +
  'Offline converters carry lethal voltages and stored energy. Safety spacing and insulation ' +
  'follow the applicable standards, local codes and licensed practice.';
