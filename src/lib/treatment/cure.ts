import { STEP_KIND_INFO } from './vocabulary.ts';

/**
 * Cure timers. A sealant applied in a step starts a timer of that material's cure period (kept
 * by the administrator per material; silicone at least overnight before disturbing the jar is
 * common practice, no published source [S15]). The plan shows when the jar may be disturbed, and
 * every later step that would disturb it is warned about until then. Warnings never block: the
 * conservator may have good reason, and the record shows what was done when.
 */
export interface CureStep {
	id: string;
	kind: keyof typeof STEP_KIND_INFO;
	title: string;
	status: 'planned' | 'started' | 'done' | 'skipped';
	startedAt: string | null;
	finishedAt: string | null;
	materials: readonly { kind: string; name: string; appliedAt: string | null; cureHours: number | null }[];
}

export interface CureTimer {
	stepId: string;
	material: string;
	appliedAt: string;
	cureHours: number;
	/** The jar may be disturbed from this time on (ISO). */
	until: string;
}

export interface CureWarning {
	stepId: string;
	/** `wait`: the step is still to do and the sealant is curing; `early`: it was started before the cure ended. */
	kind: 'wait' | 'early' | 'no-timer';
	message: string;
}

export interface CureStatus {
	timers: CureTimer[];
	/** When the last sealant has cured; null when no sealant has a timer. */
	mayDisturbAt: string | null;
	warnings: CureWarning[];
}

const fmt = (iso: string) => `${iso.slice(0, 10)} ${iso.slice(11, 16)} UTC`;

export function cureStatus(steps: readonly CureStep[], now: Date): CureStatus {
	const timers: CureTimer[] = [];
	const warnings: CureWarning[] = [];
	// Each step is warned about the timers of the sealant steps before it in the plan.
	let active: CureTimer[] = [];
	for (const step of steps) {
		const info = STEP_KIND_INFO[step.kind];
		if (info.disturbs && step.status !== 'skipped') {
			for (const t of active) {
				const until = Date.parse(t.until);
				// A step marked done without a start time began, at the latest, when it finished.
				const began = step.startedAt ?? (step.status === 'done' ? step.finishedAt : null);
				if (began !== null && Date.parse(began) < until) {
					warnings.push({ stepId: step.id, kind: 'early', message: `${step.startedAt ? 'Started' : 'Done'} at ${fmt(began)}, before ${t.material} had cured (from ${fmt(t.until)}).` });
				} else if (step.status === 'planned' && now.getTime() < until) {
					warnings.push({ stepId: step.id, kind: 'wait', message: `Wait until ${fmt(t.until)}: ${t.material} is curing (${t.cureHours} h from ${fmt(t.appliedAt)}).` });
				}
			}
		}
		if (step.kind === 'cure' && step.status === 'done' && step.finishedAt) {
			for (const t of active) {
				if (Date.parse(step.finishedAt) < Date.parse(t.until)) warnings.push({ stepId: step.id, kind: 'early', message: `Marked done at ${fmt(step.finishedAt)}, before ${t.material} had cured (from ${fmt(t.until)}).` });
			}
		}
		if (info.appliesSealant && step.status !== 'skipped') {
			const sealants = step.materials.filter((m) => m.kind === 'sealant');
			const own: CureTimer[] = [];
			for (const m of sealants) {
				if (m.appliedAt && m.cureHours !== null) {
					const until = new Date(Date.parse(m.appliedAt) + m.cureHours * 3_600_000).toISOString();
					own.push({ stepId: step.id, material: m.name || 'the sealant', appliedAt: m.appliedAt, cureHours: m.cureHours, until });
				}
			}
			// Finishing a seal may add no sealant (a trim, tape); sealing always does.
			if (step.kind === 'seal' && step.status !== 'planned' && own.length === 0) {
				warnings.push({ stepId: step.id, kind: 'no-timer', message: 'Record the sealant from the materials list and when it went on, so the cure time can be shown.' });
			}
			timers.push(...own);
			active = [...active, ...own];
		}
	}
	const mayDisturbAt = timers.length ? timers.map((t) => t.until).sort().at(-1)! : null;
	return { timers, mayDisturbAt, warnings };
}
