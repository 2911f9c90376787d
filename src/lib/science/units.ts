import { ZERO_CELSIUS_K } from './constants';

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
