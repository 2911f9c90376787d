import { citeRecord } from '$lib/catalogue/citation';
import { toLatex } from '$lib/catalogue/latex';
import { POTENTIAL } from './tests/support/citations';
const n = 5000;
const time = (label: string, f: () => unknown) => { for (let i = 0; i < 500; i++) f(); const t = performance.now(); for (let i = 0; i < n; i++) f(); console.log(label, ((performance.now() - t) / n * 1000).toFixed(1), 'µs'); };
time('toLatex ascii', () => toLatex('Em of [4Fe-4S]2+/1+ of FS1 in RoxA-H (Thermococcus demoensis)'));
time('toLatex names', () => toLatex('Müller, Jürgen'));
time('citeRecord', () => citeRecord(POTENTIAL, '2026-12-03'));
time('citeRecord no original', () => citeRecord({ ...POTENTIAL, original: null }, '2026-12-03'));
