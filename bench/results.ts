// The latest benchmark figures, kept in the repository: everything a step prints goes to
// bench/RESULTS.md under that step's heading, replacing only the steps that ran.
import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import { cpus, loadavg } from 'node:os';

const FILE = 'bench/RESULTS.md';
const captured = new Map<string, string[]>();
let current: string | null = null;
const print = console.log.bind(console);

/** From now on, what is printed belongs to `step` (until the next call). */
export function recordOutput(step: string): void {
	if (current === null) {
		console.log = (...args: unknown[]) => {
			print(...args);
			if (current) captured.get(current)?.push(args.map(String).join(' '));
		};
	}
	current = step;
	const when = new Date().toISOString().slice(0, 16).replace('T', ' ');
	captured.set(step, [
		`_${when} UTC · Node ${process.version} · ${cpus().length} cores · load average ${loadavg()[0]?.toFixed(1)} at the start_`,
		''
	]);
}

function sections(text: string): Map<string, string> {
	const out = new Map<string, string>();
	for (const part of text.split(/^## /m).slice(1)) {
		const newline = part.indexOf('\n');
		out.set(part.slice(0, newline).trim(), part.slice(newline + 1).trim());
	}
	return out;
}

/** Merges the steps that ran into bench/RESULTS.md, in a fixed order. */
export function writeResults(order: readonly string[]): void {
	const kept = existsSync(FILE) ? sections(readFileSync(FILE, 'utf8')) : new Map<string, string>();
	for (const [step, lines] of captured) {
		const [stamp, , ...printed] = lines;
		const block = printed.map((l) => l.replace(/^\n/, '')).join('\n');
		kept.set(step, `${stamp}\n\n\`\`\`\n${block}\n\`\`\``);
	}
	const body = order
		.filter((s) => kept.has(s))
		.map((s) => `## ${s}\n\n${kept.get(s)}\n`)
		.join('\n');
	writeFileSync(
		FILE,
		`# Benchmark results\n\nWritten by \`npm run bench\` (each step replaces its own section; \`npm run bench -- <step>\` runs one). Figures from the 2-core development machine; the load average says how busy it was.\n\n${body}`
	);
	print(`\nFigures written to ${FILE}`);
}
