import { Op, type Transaction } from 'sequelize';
import { TreatmentMaterial, User } from '../models/index.ts';
import { realStrengthAt20 } from '../../fluid/alcoholometry.ts';
import type { Step } from '../../treatment/schema.ts';
import type { StepView } from '../../treatment/view.ts';
import { TreatmentError } from './errors.ts';

/**
 * What the server adds to the steps a conservator sends: each material's cure period from the
 * organisation's list (kept from the first save, so a later change to the list does not rewrite
 * the record), the real strength of a fluid batch from its meter reading (OIML R 22, as for a
 * check's fluid), and the times and person of a step whose status changed without them.
 * Times in the future are refused: the record says what happened.
 */
const SKEW_MS = 10 * 60_000;

export async function deriveSteps(before: readonly StepView[], steps: readonly Step[], actorId: string, now: Date, transaction: Transaction): Promise<StepView[]> {
	const old = new Map(before.map((s) => [s.id, s]));
	const materialIds = [...new Set(steps.flatMap((s) => s.materials.map((m) => m.materialId).filter((x): x is string => x !== null)))];
	const materials = new Map((await TreatmentMaterial.findAll({ where: { id: { [Op.in]: materialIds } }, transaction })).map((m) => [m.id, m]));
	const people = [...new Set(steps.map((s) => s.doneBy).filter((x): x is string => x !== null))];
	const known = new Set((await User.findAll({ where: { id: { [Op.in]: people } }, attributes: ['id'], transaction })).map((u) => u.id));
	const future = (iso: string | null) => iso !== null && Date.parse(iso) > now.getTime() + SKEW_MS;

	return steps.map((s, i) => {
		const n = `Step ${i + 1} (“${s.title}”)`;
		const was = old.get(s.id);
		if (s.doneBy && !known.has(s.doneBy)) throw new TreatmentError(400, `${n}: the person named is not a user.`);
		const leaving = s.status !== 'planned' && s.status !== 'skipped';
		const startedAt = s.startedAt ?? (leaving && was?.status !== s.status && s.status === 'started' ? now.toISOString() : null);
		const finishedAt = s.finishedAt ?? (s.status === 'done' && was?.status !== 'done' ? now.toISOString() : null);
		if (future(startedAt) || future(finishedAt)) throw new TreatmentError(400, `${n}: a time in the future cannot be recorded.`);
		if (startedAt && finishedAt && Date.parse(finishedAt) < Date.parse(startedAt)) throw new TreatmentError(400, `${n}: it cannot finish before it started.`);
		if (s.status === 'planned' && (s.startedAt || s.finishedAt)) throw new TreatmentError(400, `${n}: a planned step has no start or finish time yet.`);
		const doneBy = s.doneBy ?? (leaving ? actorId : null);
		const materialsOut = s.materials.map((m, j) => {
			const mn = `${n}, material ${j + 1}`;
			const listed = m.materialId ? materials.get(m.materialId) : undefined;
			if (m.materialId && !listed) throw new TreatmentError(400, `${mn}: no such material on the list.`);
			if (listed && listed.kind !== m.kind) throw new TreatmentError(400, `${mn}: “${listed.name}” is a ${listed.kind}, not a ${m.kind}.`);
			if (m.kind === 'fluid' && !m.fluid) throw new TreatmentError(400, `${mn}: give the fluid batch and its strength.`);
			if (m.kind !== 'fluid' && m.fluid) throw new TreatmentError(400, `${mn}: only a fluid has a batch and a strength.`);
			const appliedAt = m.kind === 'sealant' ? (m.appliedAt ?? (leaving ? (startedAt ?? finishedAt ?? now.toISOString()) : null)) : null;
			if (future(appliedAt)) throw new TreatmentError(400, `${mn}: a time in the future cannot be recorded.`);
			const prev = was?.materials.find((x) => x.materialId === m.materialId && x.kind === m.kind && m.materialId !== null);
			const cureHours = m.kind !== 'sealant' ? null : prev ? prev.cureHours : listed?.cureHours == null ? null : Number(listed.cureHours);
			let fluid: StepView['materials'][number]['fluid'] = null;
			if (m.fluid) {
				const { readingPercentVol: r, tempC: t } = m.fluid;
				if ((r === null) !== (t === null)) throw new TreatmentError(400, `${mn}: give both the meter reading and the temperature, or neither.`);
				let realPercentVol: number | null = null;
				try {
					realPercentVol = r !== null && t !== null ? realStrengthAt20(r, t, m.fluid.glass) : null;
				} catch (err) {
					if (err instanceof RangeError) throw new TreatmentError(400, `${mn}: ${err.message}`);
					throw err;
				}
				fluid = { ...m.fluid, realPercentVol };
			}
			return { ...m, name: m.name || listed?.name || '', appliedAt, cureHours, fluid };
		});
		return { ...s, startedAt, finishedAt, doneBy, materials: materialsOut };
	});
}
