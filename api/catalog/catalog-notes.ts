/**
 * The notes the catalog responses carry (product rules 2, 3 and 5): where the numbers come from
 * and what a designer must confirm. The one place this prose is written.
 */
export const CATALOG_NOTES = {
  coreShapes:
    'Dimensions are nominal and recalled from the IEC 62317 / IEC 63093 shape families (from memory), not any supplier data: confirm every dimension against your supplier’s drawing. Effective parameters are computed from them by the IEC 60205 method; window and surface are plain geometry without a bobbin.',
  builtInMaterial:
    'A generic class: every number is invented, chosen only to be representative of the class, and is no product’s data. Use your supplier’s data for a real design.',
  materials:
    'Built-in classes carry invented, representative numbers. User materials are fitted to the loss points posted and are shared by every caller of this service.',
  wires:
    'Bare diameters follow the ASTM B258 series; resistance is annealed copper (IEC 60028) at 20 °C; overall diameters are an approximate model of the enamel build: confirm them against your supplier’s data.',
} as const;
