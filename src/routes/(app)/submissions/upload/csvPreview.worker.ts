import Papa from 'papaparse';

/**
 * Reads a chosen CSV file in the browser, off the main thread, reporting progress as it goes:
 * the header, the first rows, the row count and the delimiter. Only a preview: the server reads
 * and checks the file again and never trusts this.
 */
export interface PreviewRequest {
	file: File;
	rows: number;
}

export type PreviewMessage =
	| { type: 'progress'; fraction: number; rowsSoFar: number }
	| {
			type: 'done';
			headers: string[];
			rows: string[][];
			rowCount: number;
			delimiter: string;
			problems: number;
	  }
	| { type: 'failed'; message: string };

const post = (m: PreviewMessage) => self.postMessage(m);

self.onmessage = (event: MessageEvent<PreviewRequest>) => {
	const { file, rows: wanted } = event.data;
	let headers: string[] = [];
	const rows: string[][] = [];
	let rowCount = 0;
	let delimiter = ',';
	let problems = 0;
	Papa.parse<string[]>(file, {
		delimitersToGuess: [',', ';', '\t'],
		skipEmptyLines: 'greedy',
		chunkSize: 256 * 1024,
		chunk: (results) => {
			delimiter = results.meta.delimiter;
			problems += results.errors.filter((e) => e.code !== 'UndetectableDelimiter').length;
			for (const cells of results.data) {
				if (headers.length === 0) {
					headers = cells.map((h) => h.replace(/^\uFEFF/, '').trim());
					continue;
				}
				rowCount++;
				if (rows.length < wanted) rows.push(cells);
			}
			post({
				type: 'progress',
				fraction: Math.min(1, results.meta.cursor / file.size),
				rowsSoFar: rowCount
			});
		},
		complete: () => post({ type: 'done', headers, rows, rowCount, delimiter, problems }),
		error: (e) => post({ type: 'failed', message: e.message })
	});
};
