// The yardsticks for the API and HTTP benchmarks: the same list query served by node:http and
// better-sqlite3 directly, with no framework, validation or query builder in between; and at
// /small, a fixed 25-item JSON body, the most this machine answers at all.
import http from 'node:http';
import SQLite from 'better-sqlite3';

const db = new SQLite(process.env.DATABASE_PATH, { readonly: true });
db.pragma('busy_timeout = 5000');
const count = db.prepare('select count(*) as n from potential p where p.public_from <= @now');
const page =
	db.prepare(`select p.accession, p.version, p.couple, p.em_mv_she, p.reported_value, p.reported_unit,
	p.reference_electrode, p.ph, p.temperature_k, p.ionic_strength_m, p.buffer, p.method, p.n_electrons,
	p.uncertainty_mv, p.is_demo, p.centre_accession, p.centre_label, p.cofactor_kind,
	p.protein_accession, p.protein_name, p.organism,
	se.accession as source_accession, s.doi as source_doi, s.year as source_year, s.authors as source_authors
	from potential p
	left join source s on s.entry_id = p.source_entry_id
	left join entry se on se.id = p.source_entry_id
	where p.public_from <= @now
	order by p.protein_name asc nulls last, p.centre_label asc nulls last, p.couple asc nulls last, p.entry_id
	limit @limit offset @offset`);

// The machine's ceiling: a small JSON body (25 items) built once, no database, no framework.
const small = JSON.stringify({
	items: Array.from({ length: 25 }, (_, i) => ({
		accession: `HL${String(i).padStart(6, '0')}`,
		emMvShe: -300 + i
	}))
});

http
	.createServer((req, res) => {
		const url = new URL(req.url ?? '/', 'http://raw');
		if (url.pathname === '/small') {
			res.writeHead(200, { 'content-type': 'application/json' });
			res.end(small);
			return;
		}
		const limit = Number(url.searchParams.get('limit') ?? 100);
		const offset = Number(url.searchParams.get('offset') ?? 0);
		const now = new Date().toISOString();
		const total = count.get({ now }).n;
		const items = page.all({ now, limit, offset }).map((r) => ({
			accession: r.accession,
			version: r.version,
			centre: {
				accession: r.centre_accession,
				label: r.centre_label,
				cofactorKind: r.cofactor_kind
			},
			protein: { accession: r.protein_accession, name: r.protein_name, organism: r.organism },
			couple: r.couple,
			emMvShe: r.em_mv_she,
			reported: {
				value: r.reported_value,
				unit: r.reported_unit,
				referenceElectrode: r.reference_electrode
			},
			ph: r.ph,
			temperatureK: r.temperature_k,
			ionicStrengthM: r.ionic_strength_m,
			buffer: r.buffer,
			method: r.method,
			nElectrons: r.n_electrons,
			uncertaintyMv: r.uncertainty_mv,
			source: r.source_accession
				? {
						accession: r.source_accession,
						doi: r.source_doi,
						year: r.source_year,
						firstAuthor: JSON.parse(r.source_authors)[0] ?? null
					}
				: null,
			isDemo: r.is_demo === 1
		}));
		const next = offset + items.length < total ? offset + items.length : null;
		res.writeHead(200, { 'content-type': 'application/json' });
		res.end(JSON.stringify({ items, total, nextCursor: next === null ? null : String(next) }));
	})
	.listen(Number(process.env.PORT), '127.0.0.1', () => console.log('raw server ready'));
