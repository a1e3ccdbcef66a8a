import { CONTROL_LABELS } from '../../treatment/controls.ts';
import { GOVERNING_STATEMENT } from '../../treatment/cautions.ts';
import { HAZARD_LABELS } from '../../treatment/hazards.ts';
import { BAND_LABELS, bandOf, type Rating } from '../../treatment/risk.ts';
import { MATERIAL_KIND_LABELS, RISK_STATE_LABELS, STEP_STATUS_LABELS, TREATMENT_STATE_LABELS } from '../../treatment/vocabulary.ts';
import type { TreatmentView } from '../../treatment/view.ts';

/**
 * The condition report's treatment part, for each treatment that links this check as its before-
 * or after-treatment check: the plan and its record, the risk assessment with its sign-off, and
 * the cure times. Drawn with the report's own layout helpers so it pages and rules like the rest.
 */
export interface ReportKit {
	heading: (text: string) => void;
	pairs: (rows: [string, string][]) => void;
	para: (text: string, font?: 'body' | 'bold') => void;
	table: (cols: { t: string; w: number }[], rows: string[][]) => void;
	moveDown: (lines: number) => void;
	width: number;
}

const rated = (r: Rating) => `${r.likelihood} × ${r.severity} = ${r.likelihood * r.severity} (${BAND_LABELS[bandOf(r)].toLowerCase()})`;
const day = (iso: string | null) => (iso ? `${iso.slice(0, 10)} ${iso.slice(11, 16)} UTC` : '—');

export function treatmentSections(k: ReportKit, checkId: string, treatments: TreatmentView[]): void {
	k.heading('Treatment');
	if (treatments.length === 0) {
		k.para('No treatment links this check.');
		return;
	}
	for (const t of treatments) {
		const names = new Map([...t.people, t.author].map((p) => [p.id, p.name]));
		k.pairs([
			['Treatment', `${t.title} (${TREATMENT_STATE_LABELS[t.state].toLowerCase()})`],
			['This check', t.beforeCheck?.id === checkId ? 'Before treatment' : 'After treatment'],
			['Planned by', `${t.author.name}, ${t.createdAt.slice(0, 10)}`],
			['Purpose', t.purpose || '—'],
		]);
		k.para('Risk assessment', 'bold');
		k.pairs([
			['State', RISK_STATE_LABELS[t.riskState]],
			['Signed off', t.riskState === 'signed-off' && t.riskReviewer ? `${t.riskReviewer.name}, ${day(t.riskReviewedAt)}` : 'Not signed off'],
			...(t.riskReviewComment ? ([['Reviewer’s comment', t.riskReviewComment]] as [string, string][]) : []),
		]);
		if (t.risk.hazards.length) {
			const w = k.width;
			k.table(
				[{ t: 'Hazard', w: 110 }, { t: 'Before controls', w: 95 }, { t: 'Controls', w: w - 300 }, { t: 'Residual', w: 95 }],
				t.risk.hazards.map((h) => [
					`${HAZARD_LABELS[h.kind]}${h.description ? `: ${h.description}` : ''}`,
					rated(h.inherent),
					[...h.controls.map((c) => CONTROL_LABELS[c]), h.otherControls].filter(Boolean).join('; ') || '—',
					rated(h.residual),
				]),
			);
		}
		for (const d of t.risk.dismissed) k.para(`Judged not to apply: ${HAZARD_LABELS[d.kind]} (${d.reason})`);
		if (t.risk.notes) k.para(`Notes: ${t.risk.notes}`);
		k.para(GOVERNING_STATEMENT);
		k.moveDown(0.3);
		k.para('Plan and record', 'bold');
		const w = k.width;
		k.table(
			[{ t: 'Step', w: 130 }, { t: 'Status', w: 60 }, { t: 'Who, when', w: 110 }, { t: 'Min', w: 30 }, { t: 'Materials and notes', w: w - 330 }],
			t.steps.map((s, i) => [
				`${i + 1}. ${s.title}`,
				STEP_STATUS_LABELS[s.status],
				s.status === 'planned' ? '—' : `${s.doneBy ? (names.get(s.doneBy) ?? '—') : '—'}, ${day(s.finishedAt ?? s.startedAt)}`,
				s.minutes === null ? '' : String(s.minutes),
				[
					...s.materials.map((m) => {
						const what = `${MATERIAL_KIND_LABELS[m.kind]}: ${m.name || '—'}${m.amount ? ` (${m.amount})` : ''}`;
						if (m.fluid) return `${what}, batch ${m.fluid.batch || '—'}, ${m.fluid.realPercentVol !== null ? `${m.fluid.realPercentVol.toFixed(1)} % vol at 20 °C` : m.fluid.statedPercentVol !== null ? `made to ${m.fluid.statedPercentVol} % vol` : 'strength not recorded'}`;
						if (m.kind === 'sealant' && m.appliedAt) return `${what}, on at ${day(m.appliedAt)}${m.cureHours !== null ? `, cures ${m.cureHours} h` : ''}`;
						return what;
					}),
					s.notes,
				]
					.filter(Boolean)
					.join('; ') || '—',
			]),
		);
		if (t.cure.mayDisturbAt) k.para(`The jar may be disturbed from ${day(t.cure.mayDisturbAt)} (end of the last sealant’s cure period).`);
		const early = t.cure.warnings.filter((x) => x.kind === 'early');
		for (const e of early) k.para(`Note: ${e.message}`);
		k.moveDown(0.5);
	}
}
