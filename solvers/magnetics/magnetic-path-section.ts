/**
 * One section of a core's magnetic path for the IEC 60205 method: its length along the flux
 * (m) and its cross-section (m²), both > 0. Parallel limbs are combined into one section that
 * carries the whole flux, so their areas add.
 */
export interface MagneticPathSection {
  lengthM: number;
  areaM2: number;
}
