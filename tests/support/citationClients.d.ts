/*
 * The parts of the independent citation libraries the tests use (they ship no types):
 * citation-js (@citation-js/core with its BibTeX, RIS and CSL plugins) and citeproc-js.
 */

declare module '@citation-js/core' {
	/** A CSL-JSON item as citation-js hands it back. */
	export type CslData = Record<string, unknown> & { id: string; type: string };
	export class Cite {
		static async(data: unknown, options?: { forceType?: string }): Promise<Cite>;
		data: CslData[];
		format(
			format: 'bibliography' | 'data' | 'bibtex' | 'ris',
			options?: { format?: 'text' | 'html'; template?: string; lang?: string }
		): string;
	}
	export const plugins: {
		config: { get(plugin: string): Record<string, Record<string, unknown>> };
	};
}

declare module '@citation-js/plugin-bibtex';
declare module '@citation-js/plugin-ris';
declare module '@citation-js/plugin-csl';

declare module 'citeproc' {
	interface Sys {
		retrieveLocale(lang: string): string;
		retrieveItem(id: string): unknown;
	}
	interface Engine {
		setOutputFormat(format: 'text' | 'html' | 'rtf'): void;
		updateItems(ids: string[]): void;
		makeBibliography(): [Record<string, unknown>, string[]] | false;
	}
	const CSL: {
		Engine: new (sys: Sys, style: string, lang?: string, forceLang?: boolean) => Engine;
		PROCESSOR_VERSION: string;
	};
	export default CSL;
}
