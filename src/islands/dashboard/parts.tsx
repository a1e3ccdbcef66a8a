import type { ReactNode } from 'react';

/**
 * The pieces the home pages and the collection overview share: a titled card, a big figure (a link
 * when it opens the jars it counts), a dashed empty state and a list of counts with bars.
 */
export const slug = (s: string) => s.toLowerCase().replace(/[^a-z0-9]+/g, '-');

export function Section({ title, children, aside, testId }: { title: string; children: ReactNode; aside?: ReactNode; testId?: string }) {
	return (
		<section className="card" aria-labelledby={slug(title)} data-testid={testId}>
			<div className="mb-4 flex flex-wrap items-baseline justify-between gap-2">
				<h2 id={slug(title)} className="text-xl font-semibold">{title}</h2>
				{aside}
			</div>
			{children}
		</section>
	);
}

export function Empty({ children }: { children: ReactNode }) {
	return <p className="rounded-md border border-dashed border-ink-200 bg-paper px-4 py-6 text-ink-700">{children}</p>;
}

export function Figure({ label, value, tone, href, testId }: { label: string; value: number; tone?: 'alert' | 'caution'; href?: string; testId?: string }) {
	const colour = tone === 'alert' ? 'text-alert-700' : tone === 'caution' ? 'text-spirit-800' : 'text-ink-900';
	const body = (
		<>
			<div className={`text-3xl font-semibold tabular-nums ${colour}`}>{value.toLocaleString('en-GB')}</div>
			<div className="text-sm text-ink-700">{label}</div>
		</>
	);
	if (!href) return <div className="rounded-md bg-paper px-4 py-3" data-testid={testId}>{body}</div>;
	return (
		<a href={href} className="block rounded-md border border-transparent bg-paper px-4 py-3 hover:border-glass-300 hover:bg-glass-50" data-testid={testId}>
			{body}
			<span className="mt-1 block text-xs font-semibold text-glass-700">Show in the register →</span>
		</a>
	);
}

export interface BreakdownRow {
	key: string;
	label: string;
	count: number;
	href?: string;
	/** The bar's colour class, where the rows have a scale of their own (grades). */
	barClass?: string;
}

/** Counts with a bar each, as a share of `of` jars (a jar can carry several hazard flags). */
export function Breakdown({ title, rows, of, testId }: { title: string; rows: BreakdownRow[]; of: number; testId?: string }) {
	const total = of || 1;
	return (
		<div data-testid={testId}>
			<h3 className="text-lg font-semibold">{title}</h3>
			<ul className="mt-2 space-y-2">
				{rows.map((r) => (
					<li key={r.key} className="text-sm">
						<div className="flex justify-between gap-2">
							{r.href ? <a className="text-glass-700 underline" href={r.href}>{r.label}</a> : <span>{r.label}</span>}
							<span className="tabular-nums text-ink-700">{r.count.toLocaleString('en-GB')}</span>
						</div>
						<div className="mt-1 h-2 rounded bg-ink-100" aria-hidden="true">
							<div className={`h-2 rounded ${r.barClass ?? 'bg-glass-500'}`} style={{ width: `${(100 * r.count) / total}%` }} />
						</div>
					</li>
				))}
			</ul>
		</div>
	);
}
