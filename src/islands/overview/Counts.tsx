import { CHECK_LABELS } from '../../lib/check/vocabulary.ts';
import { registerHref } from '../../lib/overview/links.ts';
import type { Overview, OverviewQuery } from '../../lib/overview/schema.ts';
import { LABELS } from '../../lib/specimen/vocabulary.ts';
import { Breakdown, Empty, Figure, Section } from '../dashboard/parts.tsx';
import { GRADE_STYLE } from '../check/GradeBadge.tsx';

/** The overview's counts: each figure and each bar opens the register filtered to the jars it counts. */
export function Counts({ o, filters }: { o: Overview; filters: OverviewQuery }) {
	const href = (figure: Parameters<typeof registerHref>[1]) => registerHref(filters, figure);
	if (o.specimens === 0) {
		return (
			<Section title="Condition">
				<Empty>No specimens match. Choose another collection or location, or register the first jar.</Empty>
			</Section>
		);
	}
	return (
		<Section title="Condition" testId="overview-counts">
			<div className="grid gap-3 sm:grid-cols-3">
				<Figure label="Specimens" value={o.specimens} href={href({})} testId="figure-specimens" />
				<Figure label="Checks overdue" value={o.overdue} tone={o.overdue > 0 ? 'alert' : undefined} href={href({ due: 'overdue' })} testId="figure-overdue" />
				<Figure label="Checks waiting for review" value={o.inReview} href={href({ check: 'in-review' })} testId="figure-in-review" />
			</div>
			<div className="mt-6 grid gap-6 md:grid-cols-3">
				<Breakdown
					title="By overall condition"
					of={o.specimens}
					testId="by-grade"
					rows={o.byGrade.map((g) =>
						g.grade === 'not-checked'
							? { key: g.grade, label: 'Not checked yet', count: g.count, href: href({ grade: g.grade }), barClass: 'bg-ink-300' }
							: { key: g.grade, label: CHECK_LABELS.grade[g.grade], count: g.count, href: href({ grade: g.grade }), barClass: GRADE_STYLE[g.grade].fill },
					)}
				/>
				<Breakdown
					title="By treatment priority"
					of={o.specimens}
					testId="by-priority"
					rows={o.byPriority.map((p) => ({ key: p.priority, label: p.priority === 'not-set' ? 'Not set' : CHECK_LABELS.priority[p.priority], count: p.count, href: href({ priority: p.priority }) }))}
				/>
				<Breakdown
					title="Hazards by kind"
					of={o.specimens}
					testId="by-hazard"
					rows={o.byHazard.map((h) => ({ key: h.flag, label: LABELS.hazard[h.flag], count: h.count, href: href({ hazard: h.flag }) }))}
				/>
			</div>
			{o.byHazard.length > 0 && (
				<p className="notice-caution mt-6">
					Jars flagged here may hold flammable spirit, formaldehyde, unknown fluids or seals and lids with lead, arsenic, mercury or coal-tar pitch.
					Handle them only under your organisation’s risk assessment and local regulations, with the controls they require; Meniscus records hazards
					but gives no safety advice of its own.
				</p>
			)}
		</Section>
	);
}
