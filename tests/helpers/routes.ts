import fs from 'node:fs';
import path from 'node:path';

/**
 * Every route file under src/pages with the Astro route pattern it serves and the methods it
 * answers: an endpoint's exported method names; for a page, GET, plus POST when its frontmatter
 * reads `Astro.request.method === 'POST'`.
 */
export interface RouteFile {
	file: string;
	pattern: string;
	methods: string[];
}

const PAGES = path.resolve('src/pages');

export function routeFiles(dir = PAGES): RouteFile[] {
	const out: RouteFile[] = [];
	for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
		const full = path.join(dir, entry.name);
		if (entry.isDirectory()) out.push(...routeFiles(full));
		else if (/\.(astro|ts|js|mjs)$/.test(entry.name) && !entry.name.startsWith('_')) out.push(describe(full));
	}
	return out.sort((a, b) => a.pattern.localeCompare(b.pattern));
}

function describe(full: string): RouteFile {
	const rel = path.relative(PAGES, full).split(path.sep).join('/');
	const noExt = rel.replace(/\.(astro|ts|js|mjs)$/, '');
	const pattern = `/${noExt.replace(/(^|\/)index$/, '')}`.replace(/\/$/, '') || '/';
	const src = fs.readFileSync(full, 'utf8');
	let methods: string[];
	if (full.endsWith('.astro')) {
		methods = ['GET', ...(/Astro\.request\.method\s*===\s*'POST'/.test(src) ? ['POST'] : [])];
	} else {
		methods = [...src.matchAll(/export\s+(?:const|async\s+function|function)\s+(GET|HEAD|POST|PUT|PATCH|DELETE|OPTIONS|ALL)\b/g)].map(
			(m) => m[1]!,
		);
	}
	return { file: rel, pattern: pattern.replace(/^\/\//, '/'), methods: [...new Set(methods)] };
}
