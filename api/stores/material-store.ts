import type { LossPoint, SteinmetzFit } from '../../solvers/index.js';

/** What one user material holds: what was posted, its Steinmetz fit and the points' span. */
export interface UserMaterialContent {
  name: string;
  lossPoints: LossPoint[];
  fit: SteinmetzFit;
  frequencyMinHz: number;
  frequencyMaxHz: number;
  peakFluxDensityMinT: number;
  peakFluxDensityMaxT: number;
  // Optional extras as posted; `undefined` (from the parsed body) is never stored in JSON.
  saturationFluxDensityT?: number | undefined;
  initialPermeability?: number | undefined;
  initialPermeabilityTolerance?: number | undefined;
  createdAt: string;
}

/** A stored user material. */
export interface UserMaterialRecord extends UserMaterialContent {
  id: string;
}

/**
 * Returns the key names are unique under: trimmed, Unicode NFC, lower case. "Ferrite-A" and
 * " ferrite-a " are one name.
 */
export function materialNameKey(name: string): string {
  return name.trim().normalize('NFC').toLowerCase();
}

/**
 * Where user materials live, each owned by one tenant (every method takes the caller's tenant;
 * another tenant's material is as absent as an unknown one). Names are unique per tenant under
 * materialNameKey: of two concurrent creates with one name, exactly one succeeds. Records never change once stored. Every method rejects with
 * StoreUnavailableError when the backing store cannot be reached.
 */
export interface MaterialStore {
  /** Stores a new material under a fresh random id; 'name-taken' when its name is in use. */
  create(tenant: string, content: UserMaterialContent): Promise<UserMaterialRecord | 'name-taken'>;
  /** The material with this id; undefined when there is none. */
  get(tenant: string, id: string): Promise<UserMaterialRecord | undefined>;
  /** Every material, in the order they were created. */
  list(tenant: string): Promise<UserMaterialRecord[]>;
  /** True when the store can serve requests now. */
  isReady(): Promise<boolean>;
  close(): Promise<void>;
}
