import fs from 'node:fs';
import path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { call, useTestDatabase } from '../helpers/server.ts';
import { buildWorld, type World } from '../helpers/world.ts';
import { validWrites } from '../helpers/validWrites.ts';
import { db } from '../../src/lib/server/db.ts';
import { ConditionCheck, PhotoMarkLayer, Specimen, Treatment } from '../../src/lib/server/models/index.ts';

/**
 * TESTPLAN D2, the ORM's traps (Sequelize #13006: a JSON value changed in place is silently not
 * saved; #7831: a static Model.update skips the optimistic lock). Every versioned write of a JSONB
 * record is driven over HTTP with a change made only deep inside its JSON; the row as PostgreSQL
 * holds it must show the change and the next version, and a second save naming the old version must
 * get 409 and leave the row as it was. A source scan keeps static updates off the versioned models.
 */
let w: World;

beforeAll(async () => {
	useTestDatabase();
	db();
	w = await buildWorld('orm');
});

// The bodies are the routes' own JSON, reached into by path.
type Body = Record<string, any>;

interface Case {
	route: string;
	/** Sets `value` somewhere deep inside the record's JSONB. */
	change: (body: Body, value: string) => void;
	/** The same place, and the version, read back from the database. */
	stored: () => Promise<{ value: unknown; version: number }>;
}

const CASES: Case[] = [
	{
		route: 'saving a check',
		change: (b, v) => (b.check.parts.seal.note = v),
		stored: async () => {
			const r = (await ConditionCheck.findByPk(w.checkId))!;
			return { value: (r.parts as Body).seal.note, version: r.version };
		},
	},
	{
		route: 'editing a specimen',
		change: (b, v) => (b.record.hazards[0].note = v),
		stored: async () => {
			const r = (await Specimen.findByPk(w.specimenId))!;
			return { value: (r.hazards as Body[])[0]!.note, version: r.version };
		},
	},
	{
		route: 'saving a mark layer',
		change: (b, v) => (b.layer.marks[0].note = v),
		stored: async () => {
			const r = (await PhotoMarkLayer.findByPk(w.photoId))!;
			return { value: (r.layer as Body).marks[0].note, version: r.version };
		},
	},
	{
		route: 'saving a treatment',
		change: (b, v) => (b.treatment.steps[0].notes = v),
		stored: async () => {
			const r = (await Treatment.findByPk(w.treatmentId))!;
			return { value: (r.steps as Body[])[0]!.notes, version: r.version };
		},
	},
];

describe('JSONB records saved through the ORM (TESTPLAN D2)', () => {
	it.each(CASES.map((c) => [c.route, c] as const))('%s: a change deep in the JSON is stored, with the version checked', async (_name, c) => {
		const write = validWrites(w).find((v) => v.name === c.route)!;
		const body = await write.body();
		const before = await c.stored();
		const first = `D2 nested change ${process.pid}`;
		c.change(body, first);
		const res = await call(write.path, { method: write.method, cookie: write.who.cookie, json: body });
		expect(res.status, await res.clone().text()).toBe(200);
		expect(await c.stored()).toEqual({ value: first, version: before.version + 1 });
		// The same body again, still naming the old version: refused, the row untouched.
		c.change(body, 'a stale save that must not land');
		const stale = await call(write.path, { method: write.method, cookie: write.who.cookie, json: body });
		expect(stale.status).toBe(409);
		expect(await c.stored()).toEqual({ value: first, version: before.version + 1 });
	});
});

describe('static updates of versioned models (Sequelize #7831)', () => {
	// A static Model.update bypasses `version: true`. Each allowed use says why in the code beside it.
	const ALLOWED = new Map([['src/lib/server/checks/service.ts', 'Specimen.update: the derived current-condition columns, which must not bump the record’s version']]);
	const VERSIONED = ['Specimen', 'ConditionCheck', 'PhotoComparison', 'Treatment'];

	it('are used nowhere but where the code says why', () => {
		const root = path.resolve(import.meta.dirname, '..', '..');
		const found: string[] = [];
		const walk = (dir: string) => {
			for (const e of fs.readdirSync(dir, { withFileTypes: true })) {
				const p = path.join(dir, e.name);
				if (e.isDirectory()) walk(p);
				else if (/\.(ts|tsx|astro)$/.test(e.name)) {
					const text = fs.readFileSync(p, 'utf8');
					for (const m of VERSIONED) if (new RegExp(`\\b${m}\\.(update|increment|decrement)\\(`).test(text)) found.push(path.relative(root, p));
				}
			}
		};
		walk(path.join(root, 'src'));
		expect(found.filter((f) => !ALLOWED.has(f))).toEqual([]);
		// Every model named as versioned really is, so the list above cannot go stale silently.
		const models = { Specimen, ConditionCheck, Treatment };
		for (const [name, m] of Object.entries(models)) expect((m as unknown as { options: { version?: unknown } }).options.version, name).toBeTruthy();
	});
});
