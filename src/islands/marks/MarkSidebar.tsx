import { useMemo, useState } from 'react';
import { CHECK_LABELS, PARTS, type Part } from '../../lib/check/vocabulary.ts';
import { isDamage, LEVELS, type Level, type Mark, type MarkLayer, type Severity } from '../../lib/marks/schema.ts';
import type { Effect } from '../../lib/marks/tools/effects.ts';
import { LEVEL_LABEL, legendEntries, MEASURE_STYLE, PART_STYLE, SEVERITY_STYLE } from '../../lib/marks/palette.ts';
import { MEASUREMENT_CAVEAT, formatMm, formatMm2, measured, mmPerPixel } from '../../lib/marks/measure.ts';
import { SHORTCUTS, describeCombo } from '../../lib/marks/tools/shortcuts.ts';

/**
 * Beside the canvas: what new marks will say (part, term from that part's list, severity, note),
 * the selected mark's properties and size, every mark in a sortable list (click to select), parts
 * shown or hidden, the legend, reviewers' comments, and the keyboard shortcuts.
 */
export interface DamageChoice {
	part: Part;
	term: string;
	severity: Severity;
	note: string;
}

interface Props {
	photoId: string;
	layer: MarkLayer;
	terms: Record<Part, string[]>;
	editable: boolean;
	commenting: boolean;
	userId: string;
	damage: DamageChoice;
	onDamage: (d: DamageChoice) => void;
	level: Level;
	onLevel: (l: Level) => void;
	scaleMm: number;
	onScaleMm: (n: number) => void;
	selected: string[];
	onSelect: (ids: string[]) => void;
	hidden: Set<Part>;
	onHidden: (s: Set<Part>) => void;
	onPatch: (effects: Effect[]) => void;
	onComment: (layer: MarkLayer) => void;
}

const KIND_LABEL: Record<Mark['kind'], string> = { outline: 'Outline', path: 'Line', pin: 'Pin', box: 'Box', scale: 'Scale bar', grey: 'Grey reference', level: 'Level', control: 'Control point' };
const SEVERITIES: Severity[] = [1, 2, 3];

export function describe(m: Mark): string {
	if (isDamage(m)) return `${PART_STYLE[m.part].code} · ${m.term} · ${SEVERITY_STYLE[m.severity].label.toLowerCase()}`;
	if (m.kind === 'level') return LEVEL_LABEL[m.level];
	if (m.kind === 'scale') return `${m.lengthMm} mm`;
	if (m.kind === 'control') return `#${m.n}`;
	return MEASURE_STYLE.grey.label;
}

export function MarkSidebar(p: Props) {
	const [sort, setSort] = useState<'drawn' | 'part' | 'severity'>('drawn');
	const scale = mmPerPixel(p.layer);
	const one = p.selected.length === 1 ? p.layer.marks.find((m) => m.id === p.selected[0]) : undefined;
	const list = useMemo(() => {
		const ms = [...p.layer.marks];
		if (sort === 'part') ms.sort((a, b) => ('part' in a ? PARTS.indexOf(a.part) : 99) - ('part' in b ? PARTS.indexOf(b.part) : 99));
		if (sort === 'severity') ms.sort((a, b) => ('severity' in b ? b.severity : 0) - ('severity' in a ? a.severity : 0));
		return ms;
	}, [p.layer, sort]);

	return (
		<aside className="space-y-4 text-sm" aria-label="Marks">
			{p.editable && (
				<section className="card space-y-2 p-4" aria-label="New marks">
					<h2 className="text-base">New damage marks</h2>
					<label className="block">
						<span className="field-label">Part</span>
						<select className="field-input" data-testid="new-part" value={p.damage.part} onChange={(e) => { const part = e.target.value as Part; p.onDamage({ ...p.damage, part, term: p.terms[part][0] ?? '' }); }}>
							{PARTS.map((x) => (
								<option key={x} value={x}>{CHECK_LABELS.part[x]} ({PART_STYLE[x].code})</option>
							))}
						</select>
					</label>
					<label className="block">
						<span className="field-label">Damage</span>
						<select className="field-input" data-testid="new-term" value={p.damage.term} onChange={(e) => p.onDamage({ ...p.damage, term: e.target.value })}>
							{p.terms[p.damage.part].map((t) => (
								<option key={t} value={t}>{t}</option>
							))}
						</select>
					</label>
					<fieldset>
						<legend className="field-label">Severity</legend>
						<div className="mt-1 flex gap-2">
							{SEVERITIES.map((s) => (
								<label key={s} className="flex items-center gap-1">
									<input type="radio" name="severity" checked={p.damage.severity === s} onChange={() => p.onDamage({ ...p.damage, severity: s })} /> {s} {SEVERITY_STYLE[s].label.toLowerCase()}
								</label>
							))}
						</div>
					</fieldset>
					<label className="block">
						<span className="field-label">Note for new marks</span>
						<input className="field-input" value={p.damage.note} maxLength={2000} onChange={(e) => p.onDamage({ ...p.damage, note: e.target.value })} />
					</label>
					<div className="grid grid-cols-2 gap-2">
						<label className="block">
							<span className="field-label">Level tool draws</span>
							<select className="field-input" value={p.level} onChange={(e) => p.onLevel(e.target.value as Level)}>
								{LEVELS.map((l) => (
									<option key={l} value={l}>{LEVEL_LABEL[l]}</option>
								))}
							</select>
						</label>
						<label className="block">
							<span className="field-label">Scale bar length (mm)</span>
							<input className="field-input" type="number" min={1} max={10000} value={p.scaleMm} onChange={(e) => p.onScaleMm(Math.max(1, Number(e.target.value) || 100))} />
						</label>
					</div>
				</section>
			)}
			{one && <Selected mark={one} layer={p.layer} terms={p.terms} editable={p.editable} onPatch={p.onPatch} />}
			{(p.commenting || p.layer.comments.length > 0) && one && <Comments mark={one} layer={p.layer} commenting={p.commenting} userId={p.userId} onComment={p.onComment} />}
			<section className="card p-4" aria-label="All marks">
				<div className="mb-2 flex items-center justify-between">
					<h2 className="text-base">All marks ({p.layer.marks.length})</h2>
					<label className="text-xs">
						Sort{' '}
						<select value={sort} onChange={(e) => setSort(e.target.value as typeof sort)} className="rounded border border-ink-200 px-1">
							<option value="drawn">as drawn</option>
							<option value="part">by part</option>
							<option value="severity">most severe first</option>
						</select>
					</label>
				</div>
				<ul className="max-h-64 space-y-1 overflow-auto" data-testid="mark-list">
					{list.map((m) => {
						const size = measured(m, p.layer);
						return (
							<li key={m.id}>
								<button type="button" className={`w-full rounded px-2 py-1 text-left hover:bg-ink-50 ${p.selected.includes(m.id) ? 'bg-glass-50 font-semibold' : ''}`} onClick={() => p.onSelect([m.id])}>
									{KIND_LABEL[m.kind]}: {describe(m)}
									{size.areaMm2 !== null ? ` · ${formatMm2(size.areaMm2)}` : size.lengthMm !== null && m.kind === 'path' ? ` · ${formatMm(size.lengthMm)}` : ''}
								</button>
							</li>
						);
					})}
				</ul>
				<p className="mt-2 text-xs">
					<a className="text-glass-700 underline" href={`/api/photos/${p.photoId}/annotations`} download={`marks-${p.photoId}.jsonld`}>
						Download as W3C Web Annotations
					</a>
				</p>
				<p className="mt-2 text-xs text-ink-500">{scale ? `Scale set: ${(1 / scale).toFixed(2)} px per mm. ${MEASUREMENT_CAVEAT}` : 'No scale bar yet: draw one over the ruler in the photo to see sizes in mm.'}</p>
			</section>
			<section className="card p-4" aria-label="Legend and visibility">
				<h2 className="mb-2 text-base">Legend</h2>
				<ul className="space-y-1">
					{legendEntries().map((e) => (
						<li key={`${e.group}-${e.key}`} className="flex items-center gap-2">
							<svg width="36" height="12" aria-hidden="true">
								<line x1="2" y1="6" x2="34" y2="6" stroke="#000" strokeWidth={('strokeWidth' in e ? e.strokeWidth : 3) + 2} strokeDasharray={'dash' in e ? e.dash.join(' ') : undefined} />
								<line x1="2" y1="6" x2="34" y2="6" stroke={'colour' in e ? e.colour : '#d1d5db'} strokeWidth={'strokeWidth' in e ? e.strokeWidth : 3} strokeDasharray={'dash' in e ? e.dash.join(' ') : undefined} />
							</svg>
							<span className="w-6 font-mono text-xs">{'code' in e ? e.code : e.key}</span>
							<span className="flex-1">{e.label}</span>
							{e.group === 'part' && (
								<label className="text-xs">
									<input type="checkbox" checked={!p.hidden.has(e.key)} onChange={(ev) => { const s = new Set(p.hidden); if (ev.target.checked) s.delete(e.key); else s.add(e.key); p.onHidden(s); }} /> show
								</label>
							)}
						</li>
					))}
				</ul>
			</section>
			<details className="card p-4">
				<summary className="cursor-pointer font-semibold">Keyboard shortcuts</summary>
				<dl className="mt-2 grid grid-cols-[auto_1fr] gap-x-3 gap-y-1 text-xs">
					{SHORTCUTS.map((s) => (
						<div key={s.action} className="contents">
							<dt className="font-mono">{s.keys.map((k) => describeCombo(k, false)).join(' / ')}</dt>
							<dd>{s.label}</dd>
						</div>
					))}
					<dt className="font-mono">Space + drag</dt>
					<dd>Move the photo</dd>
				</dl>
			</details>
		</aside>
	);
}

function Selected({ mark, layer, terms, editable, onPatch }: { mark: Mark; layer: MarkLayer; terms: Record<Part, string[]>; editable: boolean; onPatch: (e: Effect[]) => void }) {
	const size = measured(mark, layer);
	const patch = (p: Record<string, unknown>) => onPatch([{ kind: 'update', id: mark.id, patch: p }]);
	return (
		<section className="card space-y-2 p-4" aria-label="Selected mark">
			<h2 className="text-base">{KIND_LABEL[mark.kind]}</h2>
			{isDamage(mark) && editable ? (
				<>
					<select className="field-input" aria-label="Part of the selected mark" value={mark.part} onChange={(e) => { const part = e.target.value as Part; patch({ part, term: terms[part][0] }); }}>
						{PARTS.map((x) => (
							<option key={x} value={x}>{CHECK_LABELS.part[x]}</option>
						))}
					</select>
					<select className="field-input" aria-label="Damage of the selected mark" value={mark.term} onChange={(e) => patch({ term: e.target.value })}>
						{[...new Set([mark.term, ...terms[mark.part]])].map((t) => (
							<option key={t} value={t}>{t}</option>
						))}
					</select>
					<select className="field-input" aria-label="Severity of the selected mark" value={mark.severity} onChange={(e) => patch({ severity: Number(e.target.value) })}>
						{SEVERITIES.map((s) => (
							<option key={s} value={s}>{s} {SEVERITY_STYLE[s].label.toLowerCase()}</option>
						))}
					</select>
					<textarea className="field-input min-h-16 py-2" aria-label="Note of the selected mark" defaultValue={mark.note} key={mark.id} maxLength={2000} onBlur={(e) => e.target.value !== mark.note && patch({ note: e.target.value })} />
				</>
			) : (
				<p>{describe(mark)}{isDamage(mark) && mark.note ? ` — ${mark.note}` : ''}</p>
			)}
			{mark.kind === 'scale' && editable && (
				<label className="block">
					<span className="field-label">Length (mm)</span>
					<input className="field-input" type="number" min={1} defaultValue={mark.lengthMm} key={mark.id} onBlur={(e) => Number(e.target.value) > 0 && patch({ lengthMm: Number(e.target.value) })} />
				</label>
			)}
			<p className="text-ink-700" data-testid="selected-size">
				{size.areaPx2 !== null && `Area ${Math.round(size.areaPx2).toLocaleString('en-GB')} px²${size.areaMm2 !== null ? ` ≈ ${formatMm2(size.areaMm2)}` : ''}. `}
				{size.lengthPx !== null && `Length ${Math.round(size.lengthPx).toLocaleString('en-GB')} px${size.lengthMm !== null ? ` ≈ ${formatMm(size.lengthMm)}` : ''}.`}
			</p>
		</section>
	);
}

function Comments({ mark, layer, commenting, userId, onComment }: { mark: Mark; layer: MarkLayer; commenting: boolean; userId: string; onComment: (l: MarkLayer) => void }) {
	const [text, setText] = useState('');
	const mine = layer.comments.filter((c) => c.markId === mark.id);
	return (
		<section className="card space-y-2 p-4" aria-label="Comments on the selected mark">
			<h2 className="text-base">Comments</h2>
			{mine.length === 0 ? <p className="text-ink-500">No comments on this mark.</p> : (
				<ul className="space-y-1">{mine.map((c) => <li key={c.id} className="rounded bg-ink-50 px-2 py-1">{c.text} <span className="text-xs text-ink-500">({c.createdAt.slice(0, 10)})</span></li>)}</ul>
			)}
			{commenting && (
				<form onSubmit={(e) => { e.preventDefault(); if (!text.trim()) return; onComment({ ...layer, comments: [...layer.comments, { id: `c${Date.now().toString(36)}`, markId: mark.id, authorId: userId, text: text.trim(), createdAt: new Date().toISOString() }] }); setText(''); }}>
					<textarea className="field-input min-h-16 py-2" aria-label="Comment on this mark" value={text} maxLength={2000} onChange={(e) => setText(e.target.value)} />
					<button type="submit" className="btn-secondary mt-2">Pin comment</button>
				</form>
			)}
		</section>
	);
}
