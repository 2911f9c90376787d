/*
 * Physical constants, CODATA 2018 recommended values (Tiesinga et al., Rev. Mod. Phys. 93,
 * 025010 (2021)). Since the 2019 SI redefinition e, h, k_B and N_A are exact; F and R follow.
 * The one place in Hopline where these numbers are written.
 */

/** Elementary charge, C (exact). */
export const ELEMENTARY_CHARGE_C = 1.602176634e-19;
/** Planck constant, J s (exact). */
export const PLANCK_J_S = 6.62607015e-34;
/** Reduced Planck constant ħ = h / 2π, J s. */
export const HBAR_J_S = PLANCK_J_S / (2 * Math.PI);
/** Boltzmann constant, J/K (exact). */
export const BOLTZMANN_J_PER_K = 1.380649e-23;
/** Avogadro constant, 1/mol (exact). */
export const AVOGADRO_PER_MOL = 6.02214076e23;
/** Faraday constant F = e N_A, C/mol. */
export const FARADAY_C_PER_MOL = ELEMENTARY_CHARGE_C * AVOGADRO_PER_MOL;
/** Molar gas constant R = k_B N_A, J/(mol K). */
export const GAS_J_PER_MOL_K = BOLTZMANN_J_PER_K * AVOGADRO_PER_MOL;
/** Boltzmann constant in eV/K. */
export const BOLTZMANN_EV_PER_K = BOLTZMANN_J_PER_K / ELEMENTARY_CHARGE_C;
/** Speed of light in vacuum, m/s (exact). */
export const SPEED_OF_LIGHT_M_PER_S = 299_792_458;
/** Atomic mass constant, kg (CODATA 2018). */
export const ATOMIC_MASS_KG = 1.6605390666e-27;

/** Standard temperature for tabulated potentials: 25 °C. */
export const STANDARD_TEMPERATURE_K = 298.15;
/** 0 °C in kelvin (exact by definition of the Celsius scale). */
export const ZERO_CELSIUS_K = 273.15;
/**
 * Bohr magneton μ_B = eħ / 2mₑ, J/T (CODATA 2018: 9.274 010 0783(28) × 10⁻²⁴ J T⁻¹; Tiesinga et
 * al. 2021, as above). Not exact: it carries the electron mass, so it is written as measured.
 */
export const BOHR_MAGNETON_J_PER_T = 9.2740100783e-24;
