import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import type { Page } from 'playwright-core';

/*
 * axe-core (Deque's accessibility engine, WCAG 2.x A and AA rules) injected into a page: the
 * critical and serious violations, one line per offending node. The browser context must bypass
 * the site's Content Security Policy (`bypassCSP: true`) for this one injected script.
 */

const axeSource = readFileSync(
	createRequire(import.meta.url).resolve('axe-core/axe.min.js'),
	'utf8'
);

interface Violation {
	id: string;
	impact: string | null;
	nodes: { target: string[] }[];
}

export async function seriousViolations(page: Page): Promise<string[]> {
	await page.addScriptTag({ content: axeSource });
	const violations: Violation[] = await page.evaluate(async () => {
		const axe = (
			window as unknown as { axe: { run: (c: Document) => Promise<{ violations: Violation[] }> } }
		).axe;
		return (await axe.run(document)).violations;
	});
	return violations
		.filter((v) => v.impact === 'critical' || v.impact === 'serious')
		.flatMap((v) => v.nodes.map((n) => `${v.id} (${v.impact}) at ${n.target.join(' ')}`));
}
