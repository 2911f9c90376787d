import {
	CsvLimitError,
	CsvRecordSplitter,
	parseBlock,
	type CsvBlock,
	type CsvLimits
} from '$lib/catalogue/csvRecords';

/*
 * Reads a chosen CSV file in the browser, off the main thread, reporting progress as it goes:
 * the header, the first rows, the row count and the delimiter. Only a preview: the server reads
 * and checks the file again and never trusts this. The file goes through the same record
 * splitter as on the server, so a file beyond the upload's limits (columns, length of a row or a
 * cell, rows) stops the preview at once with the server's own message.
 */
export interface PreviewRequest {
	file: File;
	rows: number;
	limits: CsvLimits;
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
const CHUNK_BYTES = 256 * 1024;

async function preview({ file, rows: wanted, limits }: PreviewRequest): Promise<PreviewMessage> {
	let headers: string[] = [];
	const rows: string[][] = [];
	let rowCount = 0;
	let problems = 0;
	const splitter = new CsvRecordSplitter(limits);
	// UTF-8 as the server reads it; the decoder drops a byte-order mark.
	const decoder = new TextDecoder('utf-8');
	const take = (block: CsvBlock | null) => {
		if (!block || !splitter.dialect) return;
		const parsed = parseBlock(block, splitter.dialect);
		problems += parsed.problems.length;
		for (const { row, cells } of parsed.records) {
			if (row === 1) headers = cells.map((h) => h.trim());
			else if (cells.some((c) => c.trim() !== '')) {
				rowCount++;
				if (rows.length < wanted) rows.push(cells);
			}
		}
	};
	for (let at = 0; at < file.size; at += CHUNK_BYTES) {
		const bytes = await file.slice(at, at + CHUNK_BYTES).arrayBuffer();
		take(splitter.push(decoder.decode(bytes, { stream: true })));
		post({
			type: 'progress',
			fraction: Math.min(1, (at + CHUNK_BYTES) / file.size),
			rowsSoFar: rowCount
		});
	}
	take(splitter.push(decoder.decode()));
	take(splitter.end());
	return {
		type: 'done',
		headers,
		rows,
		rowCount,
		delimiter: splitter.dialect?.delimiter ?? ',',
		problems
	};
}

self.onmessage = (event: MessageEvent<PreviewRequest>) => {
	preview(event.data).then(post, (e: unknown) =>
		post({
			type: 'failed',
			message:
				e instanceof CsvLimitError
					? e.message
					: `The file could not be read: ${e instanceof Error ? e.message : String(e)}`
		})
	);
};
