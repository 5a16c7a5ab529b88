/**
 * Polarization from a signal compared with a thermal reference (common
 * practice in hyperpolarization work; no single published source):
 * P = P_th · (S_hp/S_th) · (scans_th·G_th sin θ_th n_th)/(scans_hp·G_hp sin θ_hp n_hp).
 * Assumes spectra summed over scans and signals linear in receiver gain.
 */
import type { Measured } from '../types';

/** Acquisition factors of one spectrum: scans, linear gain, flip angle (rad), relative amount of spins. */
export interface Acquisition {
  readonly scans: number;
  readonly gain: number;
  readonly flip: number;
  readonly amount: number;
}

/** The factor (scans_th·G_th sin θ_th n_th)/(scans_hp·G_hp sin θ_hp n_hp) that puts both spectra on one scale. */
export function acquisitionFactor(hp: Acquisition, th: Acquisition): number {
  return (th.scans * th.gain * Math.sin(th.flip) * th.amount) / (hp.scans * hp.gain * Math.sin(hp.flip) * hp.amount);
}

/**
 * P_hp from the signals, with u(P) from the signals' noise to first order
 * (relative uncertainties in quadrature; P_th and the factors taken as exact).
 */
export function referencedPolarization(
  pThermal: number,
  sHp: number,
  uHp: number | null,
  sTh: number,
  uTh: number | null,
  factor: number,
): Measured {
  const value = pThermal * (sHp / sTh) * factor;
  const rel =
    uHp === null && uTh === null ? null : Math.hypot(uHp === null ? 0 : uHp / sHp, uTh === null ? 0 : uTh / sTh);
  return { value, uncertainty: rel === null ? null : Math.abs(value) * rel };
}
