import { closest, distance } from 'fastest-levenshtein';
import { readNumber, readTemperature } from '$lib/catalogue/entryForm';
import type { UploadColumn } from '$lib/catalogue/uploadColumns';

/*
 * Reading one CSV cell into the value its column wants: numbers with a Unicode minus or a
 * decimal comma (in semicolon files), units in the cell or the header, vocabularies matched by
 * identifier or label with a "did you mean" when nothing matches.
 */
export interface CellContext {
	/** Semicolon files may write decimals with a comma. */
	decimalComma: boolean;
	/** Unit written in the column's header, e.g. "reportedValue (V)". */
	headerUnit: string | null;
}

export type CellResult =
	{ ok: true; value: unknown; extra?: Record<string, string> } | { ok: false; message: string };

const fixDecimal = (text: string, ctx: CellContext) =>
	ctx.decimalComma ? text.replace(/^([-+\u2212]?\d+),(\d+)$/, '$1.$2') : text;

/** The unit in a header: "Em (mV vs SCE)" → "mV vs SCE"; "T [°C]" → "°C". */
export function headerUnit(header: string): string | null {
	const m = /[([{]\s*([^)\]}]+?)\s*[)\]}]/.exec(header) ?? /\/\s*(mV|V|K|°C)\s*$/i.exec(header);
	return m?.[1] ?? null;
}

/** "mV", "V", optionally followed by "vs <electrode>". */
function splitPotentialUnit(text: string): { unit?: string; electrode?: string } {
	const m = /^(mV|V)?\s*(?:vs\.?\s*(.+))?$/i.exec(text.trim());
	if (!m) return {};
	return {
		unit: m[1] ? (m[1].toLowerCase() === 'mv' ? 'mV' : 'V') : undefined,
		electrode: m[2]?.trim()
	};
}

const norm = (s: string) => s.toLowerCase().replace(/[^a-z0-9.+-]/g, '');

/** A vocabulary value by identifier or label, ignoring case and punctuation. */
export function matchOption(
	text: string,
	options: readonly { value: string; label: string }[]
): { ok: true; value: string } | { ok: false; suggestion: string | null } {
	const key = norm(text);
	const hit = options.find((o) => norm(o.value) === key || norm(o.label) === key);
	if (hit) return { ok: true, value: hit.value };
	const candidates = options.flatMap((o) => [o.value, o.label]);
	const best = closest(text, candidates);
	const near =
		distance(text.toLowerCase(), best.toLowerCase()) <= Math.max(2, Math.floor(text.length / 3));
	const option = options.find((o) => o.value === best || o.label === best);
	return { ok: false, suggestion: near && option ? option.value : null };
}

function optionMessage(text: string, column: UploadColumn, suggestion: string | null): string {
	const values = (column.options ?? []).map((o) => o.value).join(', ');
	return suggestion
		? `"${text}" is not a ${column.label.toLowerCase()}; did you mean "${suggestion}"? Allowed: ${values}`
		: `"${text}" is not a ${column.label.toLowerCase()}; allowed: ${values}`;
}

function listItems(text: string, ctx: CellContext): string[] {
	return text
		.split(ctx.decimalComma ? /[\s|]+/ : /[,;\s|]+/)
		.map((s) => s.trim())
		.filter(Boolean);
}

export function readCell(text: string, column: UploadColumn, ctx: CellContext): CellResult {
	const raw = text.trim();
	switch (column.type) {
		case 'number': {
			if (column.name === 'reportedValue') {
				// "-0.32 V", "−320 mV vs SCE": the unit and the electrode may ride in the cell.
				const m = /^([-+\u2212\u2012\u2013]?[\d.,]+(?:e[-+]?\d+)?)\s*(.*)$/i.exec(raw);
				const n = m ? readNumber(fixDecimal(m[1] as string, ctx)) : null;
				if (n === null || !m)
					return { ok: false, message: `expected a number such as -320, got "${raw}"` };
				const extra: Record<string, string> = {};
				const fromCell = splitPotentialUnit(m[2] ?? '');
				if ((m[2] ?? '').trim() && !fromCell.unit && !fromCell.electrode)
					return {
						ok: false,
						message: `"${m[2]}" is not a unit; write mV or V, optionally "vs SCE"`
					};
				const fromHeader = splitPotentialUnit(ctx.headerUnit ?? '');
				const unit = fromCell.unit ?? fromHeader.unit;
				const electrode = fromCell.electrode ?? fromHeader.electrode;
				if (unit) extra.reportedUnit = unit;
				if (electrode) extra.referenceElectrode = electrode;
				return { ok: true, value: n, extra };
			}
			const n = readNumber(fixDecimal(raw, ctx));
			if (n === null) return { ok: false, message: `expected a number, got "${raw}"` };
			return { ok: true, value: n };
		}
		case 'temperature': {
			const celsius = /^°?\s*C$/i.test(ctx.headerUnit ?? '') && !/[CK]\s*$/i.test(raw);
			const k = readTemperature(fixDecimal(raw, ctx) + (celsius ? ' °C' : ''));
			if (k === null)
				return {
					ok: false,
					message: `expected a temperature such as 298 or "25 °C", got "${raw}"`
				};
			return { ok: true, value: k };
		}
		case 'select': {
			const m = matchOption(raw, column.options ?? []);
			return m.ok
				? { ok: true, value: m.value }
				: { ok: false, message: optionMessage(raw, column, m.suggestion) };
		}
		case 'numberList':
		case 'coordinates': {
			const items = listItems(raw, ctx);
			const numbers = items.map((i) => readNumber(fixDecimal(i, ctx)));
			const bad = items.find((_, i) => numbers[i] === null);
			if (bad !== undefined) return { ok: false, message: `"${bad}" is not a number` };
			if (column.type === 'coordinates') {
				if (numbers.length !== 3)
					return { ok: false, message: `expected three numbers x y z, got "${raw}"` };
				return { ok: true, value: { x: numbers[0], y: numbers[1], z: numbers[2] } };
			}
			return { ok: true, value: numbers };
		}
		case 'textList':
			return {
				ok: true,
				value:
					column.name === 'authors'
						? raw.split(/\s*;\s*/).filter(Boolean)
						: listItems(raw, { ...ctx, decimalComma: false })
			};
		default:
			return { ok: true, value: raw };
	}
}
