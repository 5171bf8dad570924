/**
 * Default physical constants, natural units (GeV).
 *
 * Sources: α and (ħc)² from CODATA 2018; electron and muon masses from CODATA 2018 / PDG;
 * charged pion mass from the Review of Particle Physics (PDG 2022).
 */
export const PHYSICAL_CONSTANTS = {
  /** Fine-structure constant α(0), dimensionless (CODATA 2018: 1/137.035999084). */
  alpha: 1 / 137.035999084,
  /** (ħc)² in GeV² mb (CODATA 2018): 1 GeV⁻² = 0.3893793721 mb. */
  hbarC2GeV2mb: 0.3893793721,
  /** Electron mass, GeV (0.51099895000 MeV). */
  electronMass: 0.00051099895,
  /** Muon mass, GeV (105.6583755 MeV). */
  muonMass: 0.1056583755,
  /** Charged pion mass, GeV (139.57039 MeV, PDG 2022). */
  chargedPionMass: 0.13957039,
} as const;
