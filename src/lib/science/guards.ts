/* Argument guards shared by the science functions: precise messages, no NaN escapes. */

export function requireFinite(value: number, name: string): void {
	if (typeof value !== 'number' || !Number.isFinite(value)) {
		throw new TypeError(`${name} must be a finite number, got ${String(value)}`);
	}
}

export function requirePositive(value: number, name: string): void {
	requireFinite(value, name);
	if (value <= 0) throw new RangeError(`${name} must be greater than 0, got ${value}`);
}

export function requireNonNegative(value: number, name: string): void {
	requireFinite(value, name);
	if (value < 0) throw new RangeError(`${name} must not be negative, got ${value}`);
}

export function requireInRange(value: number, name: string, min: number, max: number): void {
	requireFinite(value, name);
	if (value < min || value > max) {
		throw new RangeError(`${name} must be between ${min} and ${max}, got ${value}`);
	}
}

export function requireElectronCount(n: number): void {
	if (!Number.isInteger(n) || n < 1 || n > 4) {
		throw new RangeError(`n (electrons) must be a whole number from 1 to 4, got ${n}`);
	}
}
