import { z } from 'zod';
import { db } from '../db.ts';
import { TreatmentMaterial } from '../models/index.ts';
import { audit } from '../audit.ts';
import { MATERIAL_KINDS } from '../../treatment/vocabulary.ts';
import type { MaterialView } from '../../treatment/view.ts';

/**
 * The organisation's materials list, kept by the administrator. Materials are never deleted
 * (treatments name them); a material no longer used is made inactive and leaves the pick lists.
 */
export const MaterialBodySchema = z
	.object({
		kind: z.enum(MATERIAL_KINDS),
		name: z.string().trim().min(2, 'Give the material a name.').max(200),
		cureHours: z.number().min(0, 'A cure period is 0 h or more.').max(2160, 'A cure period is at most 90 days (2160 h).').nullable().default(null),
		note: z.string().trim().max(2000).default(''),
	})
	.strict()
	.refine((m) => m.kind === 'sealant' || m.cureHours === null, { message: 'Only a sealant has a cure period.', path: ['cureHours'] });

export const MaterialPatchSchema = z
	.object({
		name: z.string().trim().min(2).max(200).optional(),
		cureHours: z.number().min(0).max(2160).nullable().optional(),
		note: z.string().trim().max(2000).optional(),
		active: z.boolean().optional(),
	})
	.strict()
	.refine((p) => Object.keys(p).length > 0, { message: 'Name at least one thing to change.' });

export class MaterialError extends Error {
	constructor(readonly status: 400 | 404 | 409, message: string) {
		super(message);
	}
}

export const materialView = (m: TreatmentMaterial): MaterialView => ({
	id: m.id,
	kind: m.kind,
	name: m.name,
	cureHours: m.cureHours === null ? null : Number(m.cureHours),
	note: m.note,
	active: m.active,
});

export async function listMaterials(includeInactive = false): Promise<MaterialView[]> {
	const rows = await TreatmentMaterial.findAll({ where: includeInactive ? {} : { active: true }, order: [['kind', 'ASC'], ['name', 'ASC']] });
	return rows.map(materialView);
}

const uniqueViolation = (err: unknown) => (err as { name?: string }).name === 'SequelizeUniqueConstraintError';

export async function createMaterial(actor: { id: string; clientAddress: string | null }, body: z.output<typeof MaterialBodySchema>): Promise<MaterialView> {
	try {
		return await db().transaction(async (transaction) => {
			const m = await TreatmentMaterial.create({ kind: body.kind, name: body.name, cureHours: body.cureHours, note: body.note }, { transaction });
			await audit({ action: 'material.create', entityType: 'material', entityId: m.id, actorId: actor.id, after: body, clientAddress: actor.clientAddress }, transaction);
			return materialView(m);
		});
	} catch (err) {
		if (uniqueViolation(err)) throw new MaterialError(409, 'A material of this kind with this name is already on the list.');
		throw err;
	}
}

export async function updateMaterial(actor: { id: string; clientAddress: string | null }, id: string, patch: z.output<typeof MaterialPatchSchema>): Promise<MaterialView> {
	try {
		return await db().transaction(async (transaction) => {
			const m = await TreatmentMaterial.findByPk(id, { transaction, lock: transaction.LOCK.UPDATE });
			if (!m) throw new MaterialError(404, 'No such material.');
			if (patch.cureHours != null && m.kind !== 'sealant') throw new MaterialError(400, 'Only a sealant has a cure period.');
			const before = materialView(m);
			m.set(patch);
			await m.save({ transaction });
			const after = materialView(m);
			await audit({ action: 'material.update', entityType: 'material', entityId: id, actorId: actor.id, before, after, clientAddress: actor.clientAddress }, transaction);
			return after;
		});
	} catch (err) {
		if (uniqueViolation(err)) throw new MaterialError(409, 'A material of this kind with this name is already on the list.');
		throw err;
	}
}
