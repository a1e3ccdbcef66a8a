import type { Role } from './roles.ts';

/**
 * Who may use which route: the one place where access is declared (DESIGN.md §2, deny by
 * default). Keys are Astro route patterns exactly as `context.routePattern` reports them (the file
 * path under src/pages without extension, `index` dropped). A route missing here, or a method
 * missing from its entry, is refused for everybody; `tests/unit/routeTable.test.ts` fails when a file
 * under src/pages has no entry, so a new route cannot ship without a rule.
 */
export type Access = 'public' | 'signed-in' | readonly Role[];
export type Method = 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE' | 'OPTIONS' | 'HEAD';
/** HEAD falls back to GET's rule unless a route declares HEAD itself (tus asks for offsets with HEAD only). */
export type RouteRule = Partial<Record<Method, Access>>;

const ADMIN = ['admin'] as const;
const CONSERVATOR = ['conservator'] as const;
const UPLOADER = ['conservator', 'admin'] as const;
const ORIGINALS = ['conservator', 'reviewer', 'admin'] as const;
/** Who reads the collection overview: the people who look after the jars (administrators keep the lists). */
const COLLECTION = ['conservator', 'reviewer', 'curator'] as const;
const COMPARERS = ['conservator', 'reviewer'] as const;

export const ROUTE_RULES: Readonly<Record<string, RouteRule>> = {
	// Sign-in, sign-out and password recovery.
	'/login': { GET: 'public', POST: 'public' },
	'/logout': { POST: 'signed-in' },
	'/reset': { GET: 'public', POST: 'public' },
	'/reset/[token]': { GET: 'public', POST: 'public' },
	// First run without demo data; closes itself once any account exists.
	'/setup': { GET: 'public', POST: 'public' },
	// Everybody's home; what it shows depends on the role.
	'/': { GET: 'signed-in' },
	'/api/me': { GET: 'signed-in' },
	'/api/home': { GET: 'signed-in' },
	// One's own mail settings (the optional check mails); the route knows only the signed-in user.
	'/account/mail': { GET: 'signed-in' },
	'/api/me/mail-preferences': { GET: 'signed-in', PATCH: 'signed-in' },
	// The collection overview: the curator's home, and a page of its own for conservators and reviewers.
	'/overview': { GET: COLLECTION },
	'/api/overview': { GET: COLLECTION },
	// The register. Conservators register and edit specimens; everyone signed in reads them.
	'/specimens': { GET: 'signed-in' },
	'/specimens/new': { GET: CONSERVATOR },
	'/specimens/[id]': { GET: 'signed-in' },
	'/specimens/[id]/edit': { GET: CONSERVATOR },
	'/api/specimens': { GET: 'signed-in', POST: CONSERVATOR },
	'/api/specimens/export': { GET: 'signed-in' },
	// CSV import of the register: it creates and changes records, so conservators only.
	'/specimens/import': { GET: CONSERVATOR },
	'/api/specimens/import/preview': { POST: CONSERVATOR },
	'/api/specimens/import/commit': { POST: CONSERVATOR },
	'/api/specimens/[id]': { GET: 'signed-in', PUT: CONSERVATOR },
	'/api/specimens/[id]/history': { GET: 'signed-in' },
	'/api/specimens/[id]/timeline': { GET: 'signed-in' },
	// Open exports: the specimen's photographs as an IIIF manifest, its mark pages, and checks as CSV.
	'/api/specimens/[id]/manifest': { GET: 'signed-in' },
	'/api/specimens/[id]/manifest/annotations/[photo]': { GET: 'signed-in' },
	'/api/checks/export.csv': { GET: 'signed-in' },
	'/api/locations': { GET: 'signed-in', POST: ADMIN },
	'/api/locations/[id]': { PATCH: ADMIN },
	// Condition checks. Conservators open, edit and submit; reviewers approve or return (the workflow
	// in src/lib/check/workflow.ts decides each transition); everybody signed in reads.
	'/checks/[id]': { GET: 'signed-in' },
	'/api/specimens/[id]/checks': { GET: 'signed-in', POST: CONSERVATOR },
	'/api/checks': { GET: ['conservator', 'reviewer'] },
	'/api/checks/[id]': { GET: 'signed-in', PUT: CONSERVATOR },
	'/api/checks/[id]/submit': { POST: CONSERVATOR },
	'/api/checks/[id]/history': { GET: 'signed-in' },
	'/api/checks/[id]/review': { POST: ['reviewer'] },
	// Treatments. Conservators plan, assess risks and record the work; reviewers sign off risk
	// assessments (src/lib/treatment/workflow.ts decides each step); everybody signed in reads.
	'/treatments/[id]': { GET: 'signed-in' },
	'/api/specimens/[id]/treatments': { GET: 'signed-in', POST: CONSERVATOR },
	'/api/treatments': { GET: ['conservator', 'reviewer'] },
	'/api/treatments/export.csv': { GET: 'signed-in' },
	'/api/treatments/[id]': { GET: 'signed-in', PUT: CONSERVATOR },
	'/api/treatments/[id]/risk-submit': { POST: CONSERVATOR },
	'/api/treatments/[id]/risk-review': { POST: ['reviewer'] },
	'/api/treatments/[id]/close': { POST: CONSERVATOR },
	// The materials list (sealants with their cure periods, threads, …) is kept by administrators.
	'/api/treatment-materials': { GET: 'signed-in', POST: ADMIN },
	'/api/treatment-materials/[id]': { PATCH: ADMIN },
	'/api/vocabulary/terms': { GET: 'signed-in', POST: ADMIN },
	'/api/settings/intervals': { GET: 'signed-in', PUT: ADMIN },
	// Fluid tools: computations only, nothing stored; every signed-in role may use them.
	'/fluid': { GET: 'signed-in' },
	'/api/fluid/strength': { POST: 'signed-in' },
	'/api/fluid/dilute': { POST: 'signed-in' },
	'/api/fluid/water': { POST: 'signed-in' },
	'/api/fluid/top-up': { POST: 'signed-in' },
	'/api/fluid/jar': { POST: 'signed-in' },
	'/api/fluid/airspace': { POST: 'signed-in' },
	'/api/fluid/trend': { POST: 'signed-in' },
	// Photographs. Conservators and administrators upload (tus; which record they may add to is
	// checked per upload); everyone signed in sees photos; masters (GPS, serial numbers) go to fewer.
	'/api/uploads/[...path]': { HEAD: UPLOADER, POST: UPLOADER, PATCH: UPLOADER, DELETE: UPLOADER },
	'/api/uploads/status': { GET: UPLOADER },
	'/api/photos/match': { POST: UPLOADER },
	'/api/photos/[id]': { GET: 'signed-in' },
	'/api/photos/[id]/original': { GET: ORIGINALS },
	'/api/photos/[id]/thumbnail': { GET: 'signed-in' },
	'/api/photos/[id]/display': { GET: 'signed-in' },
	'/api/photos/[id]/tiles/[...path]': { GET: 'signed-in' },
	// Marks on a photo: conservators draw, reviewers comment (checked per layer); everyone reads.
	'/api/photos/[id]/marks': { GET: 'signed-in', PUT: ['conservator', 'reviewer'] },
	'/api/photos/[id]/annotations': { GET: 'signed-in', POST: CONSERVATOR },
	'/api/specimens/[id]/photos': { GET: 'signed-in' },
	'/api/checks/[id]/photos': { GET: 'signed-in' },
	'/api/checks/[id]/report.pdf': { GET: 'signed-in' },
	'/photos/[id]': { GET: 'signed-in' },
	'/photos/[id]/marks': { GET: 'signed-in' },
	// Comparing two photographs of a jar: everyone signed in looks; conservators and reviewers save
	// comparisons (reviewers compare before they decide). The server computes what is stored.
	'/api/specimens/[id]/comparison-sources': { GET: 'signed-in' },
	'/api/photos/[id]/fluid-colour': { GET: 'signed-in' },
	'/api/specimens/[id]/comparisons': { GET: 'signed-in', POST: COMPARERS },
	'/api/comparisons/[id]': { GET: 'signed-in', PUT: COMPARERS },
	'/specimens/[id]/compare': { GET: 'signed-in' },
	'/comparisons/[id]': { GET: 'signed-in' },
	// Administration.
	'/admin/users': { GET: ADMIN },
	'/admin/mailbox': { GET: ADMIN },
	'/admin/security': { GET: ADMIN },
	'/admin/lists': { GET: ADMIN },
	'/api/users': { GET: ADMIN, POST: ADMIN },
	'/api/security-events': { GET: ADMIN },
	'/api/users/[id]': { PATCH: ADMIN },
	'/api/users/[id]/invitation': { POST: ADMIN },
	'/api/dev/mailbox': { GET: ADMIN },
};

export type Decision =
	| { kind: 'allow' }
	| { kind: 'sign-in' }
	| { kind: 'forbidden'; reason: 'role' | 'no-rule' | 'method' };

/** The decision for one request. HEAD is treated as GET, as HTTP defines it. */
export function decide(
	routePattern: string | undefined,
	method: string,
	user: { role: Role } | null,
	rules: Readonly<Record<string, RouteRule>> = ROUTE_RULES,
): Decision {
	const rule = routePattern === undefined ? undefined : rules[routePattern];
	if (!rule) return { kind: 'forbidden', reason: 'no-rule' };
	const upper = method.toUpperCase();
	const m = (upper === 'HEAD' && !Object.hasOwn(rule, 'HEAD') ? 'GET' : upper) as keyof RouteRule;
	const access = Object.hasOwn(rule, m) ? rule[m] : undefined;
	if (access === undefined) return { kind: 'forbidden', reason: 'method' };
	if (access === 'public') return { kind: 'allow' };
	if (!user) return { kind: 'sign-in' };
	if (access === 'signed-in' || access.includes(user.role)) return { kind: 'allow' };
	return { kind: 'forbidden', reason: 'role' };
}

/**
 * Where to send someone after sign-in. Only a path on this site is accepted (`/x`, never `//x`
 * or `https://…`), so `?next=` cannot be used to bounce a user to another site.
 */
export function safeNextPath(next: string | null | undefined): string {
	if (!next || !next.startsWith('/') || next.startsWith('//') || next.startsWith('/\\')) return '/';
	if (/[\u0000-\u001f]/.test(next)) return '/';
	return next;
}
