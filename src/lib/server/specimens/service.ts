import { UniqueConstraintError } from 'sequelize';
import { db } from '../db.ts';
import { Specimen, StorageLocation } from '../models/index.ts';
import { audit } from '../audit.ts';
import { specimenView } from './presenter.ts';
import { changedFields } from '../../specimen/diff.ts';
import type { Specimen as SpecimenInput } from '../../specimen/schema.ts';
import type { SpecimenView } from '../../specimen/view.ts';

/**
 * Creating and editing specimens. Each change commits with its audit event; an edit must name the
 * version it was based on, and a stale one is refused with the record as it is now, so the person
 * can see what changed and keep what they typed.
 */
export class SpecimenError extends Error {
	constructor(
		readonly status: 400 | 404 | 409,
		message: string,
		/** On a stale save: the record as it is now. */
		readonly current?: SpecimenView,
	) {
		super(message);
	}
}

interface Actor {
	id: string;
	clientAddress: string | null;
}

const withLocation = { include: [{ model: StorageLocation, as: 'location' }] };

async function checkLocation(id: string | null, transaction: import('sequelize').Transaction) {
	if (id && !(await StorageLocation.findByPk(id, { transaction }))) throw new SpecimenError(400, 'That storage location does not exist.');
}

function duplicate(objectNumber: string): SpecimenError {
	return new SpecimenError(409, `A specimen with object number ${objectNumber} is registered already.`);
}

export async function getSpecimen(id: string): Promise<SpecimenView | null> {
	const s = await Specimen.findByPk(id, withLocation);
	return s ? specimenView(s) : null;
}

export async function createSpecimen(actor: Actor, input: SpecimenInput): Promise<SpecimenView> {
	try {
		return await db().transaction(async (transaction) => {
			await checkLocation(input.storageLocationId, transaction);
			const s = await Specimen.create({ ...input, deletedAt: null }, { transaction });
			const view = specimenView((await Specimen.findByPk(s.id, { ...withLocation, transaction }))!);
			await audit({ action: 'specimen.create', entityType: 'specimen', entityId: s.id, actorId: actor.id, after: view, clientAddress: actor.clientAddress }, transaction);
			return view;
		});
	} catch (err) {
		if (err instanceof UniqueConstraintError) throw duplicate(input.objectNumber);
		throw err;
	}
}

export async function updateSpecimen(actor: Actor, id: string, version: number, input: SpecimenInput): Promise<SpecimenView> {
	try {
		return await db().transaction(async (transaction) => {
			const s = await Specimen.findByPk(id, { ...withLocation, transaction, lock: { level: transaction.LOCK.UPDATE, of: Specimen } });
			if (!s) throw new SpecimenError(404, 'No such specimen.');
			const before = specimenView(s);
			if (s.version !== version) {
				throw new SpecimenError(
					409,
					'Someone saved this record while you were editing it. Your changes are kept in the form; compare them with the record as it is now and save again.',
					before,
				);
			}
			await checkLocation(input.storageLocationId, transaction);
			// A fresh array for JSONB, so Sequelize sees the change (STACK.md).
			s.set({ ...input, hazards: input.hazards.map((h) => ({ ...h })) });
			await s.save({ transaction });
			const after = specimenView((await Specimen.findByPk(id, { ...withLocation, transaction }))!);
			const changes = changedFields(before, after, ['version', 'updatedAt']);
			await audit({ action: 'specimen.update', entityType: 'specimen', entityId: id, actorId: actor.id, before: pick(before, changes), after: pick(after, changes), clientAddress: actor.clientAddress }, transaction);
			return after;
		});
	} catch (err) {
		if (err instanceof UniqueConstraintError) throw duplicate(input.objectNumber);
		throw err;
	}
}

function pick(v: SpecimenView, changes: { field: string }[]): Record<string, unknown> {
	return Object.fromEntries(changes.map((c) => [c.field, (v as Record<string, unknown>)[c.field]]));
}
