import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { QueryTypes } from 'sequelize';
import { beforeAll, describe, expect, inject, it } from 'vitest';
import { useTestDatabase } from '../helpers/server.ts';
import { db } from '../../src/lib/server/db.ts';

/**
 * The demo photographs (drawn by the seeder, ingested by the real pipeline; the tests seed those of
 * each jar's latest check): one front view per check at least, dated on the check's day, and every
 * master on disk hashing to the SHA-256 its row records.
 */
beforeAll(() => {
	useTestDatabase();
	db();
});

interface Row {
	object_number: string;
	checked_on: string;
	captured_raw: string;
	camera: string;
	sha256: string;
	master_path: string;
	view: string;
	derivatives: string;
}

describe('the demo photographs', () => {
	it('show each demo jar at its latest check, dated that day, with intact masters', async () => {
		const rows = await db().query<Row>(
			`SELECT s.object_number, c.checked_on::text AS checked_on, p.captured_raw, p.camera, p.sha256, p.master_path, p.view,
			        (SELECT count(*) FROM photo_derivatives d WHERE d.photo_id = p.id AND d.set_id = p.derivative_set)::text AS derivatives
			 FROM photos p JOIN condition_checks c ON c.id = p.check_id JOIN specimens s ON s.id = p.specimen_id
			 WHERE s.object_number LIKE 'STC.%' AND p.file_name LIKE s.object_number || ' %'`,
			{ type: QueryTypes.SELECT },
		);
		const jars = new Set(rows.map((r) => r.object_number));
		expect(jars.size).toBe(30);
		for (const r of rows) {
			expect(r.captured_raw.slice(0, 10)).toBe(r.checked_on.replaceAll('-', ':'));
			expect(r.camera).toBe('Demo Optics Survey 24');
			expect(r.derivatives).toBe('3');
			const bytes = fs.readFileSync(path.join(inject('uploadsDir'), r.master_path));
			expect(crypto.createHash('sha256').update(bytes).digest('hex')).toBe(r.sha256);
		}
		expect(rows.filter((r) => r.view === 'front').length).toBeGreaterThanOrEqual(30);
	});
});

describe('the demo marks', () => {
	it('map every demo front view: scale bar over the ruler, grey reference, levels, and the damage its check found', async () => {
		const rows = await db().query<{ layer: { marks: { kind: string; part?: string; lengthMm?: number }[] }; parts: Record<string, { grade: string | null; terms: string[] }> }>(
			`SELECT m.layer, c.parts FROM mark_layers m JOIN photos p ON p.id = m.photo_id JOIN condition_checks c ON c.id = p.check_id
			 JOIN specimens s ON s.id = p.specimen_id WHERE s.object_number LIKE 'STC.%' AND p.view = 'front' AND p.file_name LIKE s.object_number || ' %'`,
			{ type: QueryTypes.SELECT },
		);
		expect(rows.length).toBeGreaterThanOrEqual(30);
		for (const { layer, parts } of rows) {
			const kinds = layer.marks.map((m) => m.kind);
			expect(kinds).toEqual(expect.arrayContaining(['scale', 'grey', 'level']));
			expect(layer.marks.find((m) => m.kind === 'scale')?.lengthMm).toBe(100);
			const damaged = Object.entries(parts).filter(([, p]) => p.grade && p.grade !== 'good' && p.terms.length > 0).map(([part]) => part);
			expect(layer.marks.filter((m) => m.part).map((m) => m.part).sort()).toEqual(damaged.sort());
		}
	});
});
