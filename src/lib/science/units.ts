import {
	AVOGADRO_PER_MOL,
	ELEMENTARY_CHARGE_C,
	PLANCK_J_S,
	SPEED_OF_LIGHT_M_PER_S,
	ZERO_CELSIUS_K
} from './constants';

/*
 * Unit conversions used across Hopline. Each conversion is written once, here.
 * Stored and computed units: potentials mV, temperature K, distances Å, energies eV, rates s⁻¹.
 */

export const POTENTIAL_UNITS = ['mV', 'V'] as const;
export type PotentialUnit = (typeof POTENTIAL_UNITS)[number];

export const TEMPERATURE_UNITS = ['K', 'C'] as const;
export type TemperatureUnit = (typeof TEMPERATURE_UNITS)[number];

function assertFinite(value: number, name: string): void {
	if (typeof value !== 'number' || !Number.isFinite(value)) {
		throw new TypeError(`${name} must be a finite number, got ${String(value)}`);
	}
}

/**
 * A potential in the given unit, in millivolts.
 * @throws {TypeError} when the value is not finite.
 * @example potentialToMv(-0.42, 'V') // -420
 */
export function potentialToMv(value: number, unit: PotentialUnit): number {
	assertFinite(value, 'potential');
	return unit === 'V' ? value * 1000 : value;
}

/**
 * A temperature in the given unit, in kelvin; rejects temperatures below absolute zero.
 * @throws {TypeError} when the value is not finite. @throws {RangeError} below 0 K.
 * @example temperatureToK(25, 'C') // 298.15
 */
export function temperatureToK(value: number, unit: TemperatureUnit): number {
	assertFinite(value, 'temperature');
	const kelvin = unit === 'C' ? value + ZERO_CELSIUS_K : value;
	if (kelvin < 0) throw new RangeError(`temperature ${value} ${unit} is below absolute zero`);
	return kelvin;
}

/** Kelvin to degrees Celsius. */
export function kelvinToCelsius(kelvin: number): number {
	assertFinite(kelvin, 'temperature');
	return kelvin - ZERO_CELSIUS_K;
}

export const ENERGY_UNITS = ['kJ/mol', 'kcal/mol', 'cm-1', 'eV'] as const;
export type EnergyUnit = (typeof ENERGY_UNITS)[number];

/** How each energy unit is written on screen. */
export const ENERGY_UNIT_LABELS: Record<EnergyUnit, string> = {
	'kJ/mol': 'kJ/mol',
	'kcal/mol': 'kcal/mol',
	'cm-1': 'cm⁻¹',
	eV: 'eV'
};

/**
 * One unit of each, in J/mol: the thermochemical calorie (4.184 J exactly, as in ISO 80000-5);
 * a wavenumber by E = hc·ν̃ and an electronvolt by E = e·1 V, each per mole (CODATA 2018 constants).
 */
const JOULES_PER_MOL: Record<EnergyUnit, number> = {
	'kJ/mol': 1000,
	'kcal/mol': 4184,
	'cm-1': PLANCK_J_S * SPEED_OF_LIGHT_M_PER_S * 100 * AVOGADRO_PER_MOL,
	eV: ELEMENTARY_CHARGE_C * AVOGADRO_PER_MOL
};

/**
 * A molar energy (or a wavenumber, as an energy) from one unit to another.
 * @throws {TypeError} when the value is not finite.
 * @example convertEnergy(1, 'kcal/mol', 'kJ/mol') // 4.184
 * @example convertEnergy(1, 'kcal/mol', 'cm-1') // ≈ 349.755
 */
export function convertEnergy(value: number, from: EnergyUnit, to: EnergyUnit): number {
	assertFinite(value, 'energy');
	return from === to ? value : (value * JOULES_PER_MOL[from]) / JOULES_PER_MOL[to];
}
