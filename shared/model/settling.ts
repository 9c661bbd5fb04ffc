/**
 * Settling (sinking) velocity of particles and cells in still water.
 *
 * SI units throughout: diameter m, density kg m⁻³, dynamic viscosity Pa s,
 * kinematic viscosity m² s⁻¹, velocity m s⁻¹ (positive downward).
 * Inputs are assumed physical (positive diameter and viscosity); a particle
 * lighter than the water gets a negative (rising) Stokes velocity, and the
 * grain formulas return NaN for it.
 */

import { seawaterDensity, seawaterDynamicViscosity } from './seawater.ts';

/** Gravitational acceleration, m s⁻². */
export const GRAVITY = 9.81;

const SECONDS_PER_DAY = 86_400;

export interface StokesInput {
  diameterM: number;
  particleDensity: number;
  waterDensity: number;
  /** Pa s */
  dynamicViscosity: number;
  /**
   * Form resistance φ_r ≥ 1: how much slower a real cell sinks than the
   * sphere of the same volume and density (Reynolds 2006). 1 = sphere.
   */
  formResistance?: number;
}

/**
 * Stokes' law with a form-resistance factor:
 *   ws = g d² (ρp − ρw) / (18 μ φ_r).
 * Stokes (1851), Trans. Camb. Phil. Soc. 9:8–106; φ_r after Reynolds (2006),
 * "The Ecology of Phytoplankton", Cambridge UP, §2 [formula from memory].
 * Valid for particle Reynolds number ws d/ν ≲ 0.5.
 */
export function stokesSettlingVelocity(input: StokesInput): number {
  const { diameterM, particleDensity, waterDensity, dynamicViscosity, formResistance = 1 } = input;
  return (
    (GRAVITY * diameterM * diameterM * (particleDensity - waterDensity)) /
    (18 * dynamicViscosity * formResistance)
  );
}

export interface GrainInput {
  diameterM: number;
  particleDensity: number;
  waterDensity: number;
  /** m² s⁻¹ */
  kinematicViscosity: number;
}

/**
 * Dimensionless grain size D* = d [g (s − 1)/ν²]^(1/3), s = ρs/ρw
 * (Soulsby 1997, "Dynamics of Marine Sands", Thomas Telford, eq. 75 [equation number from memory]).
 */
export function dimensionlessGrainSize(input: GrainInput): number {
  const { diameterM, particleDensity, waterDensity, kinematicViscosity } = input;
  const s = particleDensity / waterDensity;
  return diameterM * Math.cbrt((GRAVITY * (s - 1)) / (kinematicViscosity * kinematicViscosity));
}

/**
 * Settling velocity of natural sand grains, Soulsby (1997) eq. 102:
 *   ws = (ν/d) [sqrt(10.36² + 1.049 D*³) − 10.36].
 */
export function soulsbySettlingVelocity(input: GrainInput): number {
  const dStar = dimensionlessGrainSize(input);
  return (
    (input.kinematicViscosity / input.diameterM) *
    (Math.sqrt(10.36 * 10.36 + 1.049 * dStar * dStar * dStar) - 10.36)
  );
}

/**
 * Ferguson & Church (2004), "A simple universal equation for grain settling
 * velocity", J. Sediment. Res. 74(6):933–937:
 *   ws = R g d² / (C1 ν + sqrt(0.75 C2 R g d³)), R = s − 1.
 * Constants [from memory]: C1 = 18, C2 = 0.4 smooth spheres; C1 = 18,
 * C2 = 1.0 natural grains by sieve diameter (the defaults); C1 = 20,
 * C2 = 1.1 natural grains by nominal diameter; C1 = 24, C2 = 1.2 very
 * angular grains. C1 = 18 gives Stokes' law for small grains.
 */
export function fergusonChurchSettlingVelocity(input: GrainInput, c1 = 18, c2 = 1.0): number {
  const { diameterM: d, particleDensity, waterDensity, kinematicViscosity: nu } = input;
  const r = particleDensity / waterDensity - 1;
  return (r * GRAVITY * d * d) / (c1 * nu + Math.sqrt(0.75 * c2 * r * GRAVITY * d * d * d));
}

export interface CellInput {
  /** Equivalent spherical diameter, µm. */
  diameterUm: number;
  /** Cell density, kg m⁻³ (phytoplankton typically 1030–1200). */
  cellDensity: number;
  /** Practical salinity of the water. */
  salinity: number;
  /** Water temperature, °C. */
  tempC: number;
  /** Form resistance φ_r ≥ 1 (default 1, a sphere). */
  formResistance?: number;
}

export interface CellSettling {
  /** Settling velocity, m s⁻¹ (positive down; negative for a buoyant cell). */
  mPerS: number;
  /** Settling velocity, m d⁻¹. */
  mPerDay: number;
  /** Particle Reynolds number |ws| d / ν; Stokes' law holds for ≲ 0.5. */
  reynolds: number;
}

/**
 * Stokes settling velocity of a phytoplankton cell or cyst in seawater,
 * with the water's density from EOS-80 and viscosity from Sharqawy et al.
 * (2010) (see seawater.ts) and an optional form-resistance factor.
 */
export function cellSettlingVelocity(input: CellInput): CellSettling {
  const diameterM = input.diameterUm * 1e-6;
  const waterDensity = seawaterDensity(input.salinity, input.tempC);
  const dynamicViscosity = seawaterDynamicViscosity(input.salinity, input.tempC);
  const ws = stokesSettlingVelocity({
    diameterM,
    particleDensity: input.cellDensity,
    waterDensity,
    dynamicViscosity,
    formResistance: input.formResistance ?? 1,
  });
  return {
    mPerS: ws,
    mPerDay: ws * SECONDS_PER_DAY,
    reynolds: (Math.abs(ws) * diameterM * waterDensity) / dynamicViscosity,
  };
}
