import type { Waveform } from '../../waveform/waveform.js';

/**
 * Returns the peak-to-peak output ripple, V: ΔQ/C + ESR·Δi. ΔQ is the charge the capacitor alone
 * supplies while the secondary current is below the load current, ∫(Io − is)⁺dt, which is the
 * peak-to-peak excursion of its charge when is − Io changes sign twice per period, as in a
 * flyback (Erickson & Maksimović, 2nd ed. (from memory), §2.3 capacitor charge; common practice);
 * Δi is the
 * secondary current's peak-to-peak step through the ESR. Adding both peaks is conservative.
 */
export function flybackOutputRippleV(
  secondaryA: Waveform,
  loadCurrentA: number,
  capacitanceF: number,
  esrOhm: number,
): number {
  const { timesS, values } = secondaryA;
  let deficitC = 0;
  let highest = -Infinity;
  let lowest = Infinity;
  for (let i = 0; i < values.length; i++) {
    const value = values[i] as number;
    if (value > highest) highest = value;
    if (value < lowest) lowest = value;
    if (i === 0) continue;
    const durationS = (timesS[i] as number) - (timesS[i - 1] as number);
    const x0 = loadCurrentA - (values[i - 1] as number);
    const x1 = loadCurrentA - value;
    if (x0 >= 0 && x1 >= 0) deficitC += 0.5 * (x0 + x1) * durationS;
    else if (x0 > 0) deficitC += (0.5 * x0 * x0 * durationS) / (x0 - x1);
    else if (x1 > 0) deficitC += (0.5 * x1 * x1 * durationS) / (x1 - x0);
  }
  return deficitC / capacitanceF + esrOhm * (highest - lowest);
}
