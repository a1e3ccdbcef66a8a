import { beforeAll, describe, expect, it } from 'vitest';
import { call, useTestDatabase } from '../helpers/server.ts';
import { cookieFor, makeUser } from '../helpers/users.ts';

/** The fluid calculators' API: answers for good input, a 400 that says what is wrong for bad. */
let cookie = '';
beforeAll(async () => {
	useTestDatabase();
	cookie = await cookieFor((await makeUser('curator', { tag: 'fluid' })).user.id);
});
const post = (path: string, json: unknown) => call(`/api/fluid/${path}`, { cookie, json });

describe('fluid calculators over HTTP', () => {
	it('corrects a meter reading, showing the densities used', async () => {
		const res = await post('strength', { readingPercentVol: 70, tempC: 25 });
		expect(res.status).toBe(200);
		const body = await res.json();
		expect(body.realPercentVol).toBeCloseTo(68.35, 2);
		expect(body.markedDensityKgM3).toBeCloseTo(885.56, 2);
	});

	it('answers every calculator', async () => {
		const jar = { shape: 'oval', widthMm: 120, depthMm: 80, heightMm: 150 };
		const cases: [string, unknown][] = [
			['dilute', { stockPercentVol: 96, targetPercentVol: 70, targetVolumeMl: 1000 }],
			['water', { fromPercentVol: 95, toPercentVol: 70, volumeMl: 100 }],
			['top-up', { currentVolumeMl: 850, currentPercentVol: 66, targetVolumeMl: 1000, targetPercentVol: 70, stockPercentVol: 96 }],
			['jar', { jar, levelMm: 100 }],
			['airspace', { jar, material: 'borosilicate', percentVol: 70, fillTempC: 18, maxTempC: 28 }],
			['trend', { points: [{ date: '2020-01-01', value: 180 }, { date: '2021-01-01', value: 178 }, { date: '2022-01-01', value: 176.1 }], lineMm: 150, mlPerMm: 7.5 }],
		];
		for (const [path, json] of cases) expect((await post(path, json)).status, path).toBe(200);
		const water = await (await post('water', { fromPercentVol: 95, toPercentVol: 70, volumeMl: 100 })).json();
		expect(water.waterMl).toBeCloseTo(39.1, 1);
		expect(water.naiveWaterMl).toBeCloseTo(35.71, 2);
	});

	it('refuses bad input with a 400 and a message that says what is wrong', async () => {
		const cases: [string, unknown, RegExp][] = [
			['strength', { readingPercentVol: 70, tempC: 55 }, /between -20 and \+40 °C/],
			['strength', { readingPercentVol: 'seventy', tempC: 20 }, /Reading: enter a number/],
			['strength', { readingPercentVol: 70, tempC: 20, glass: 'lead crystal' }, /glass|Invalid option/i],
			['strength', { readingPercentVol: 70, tempC: 20, extra: 1 }, /Unrecognized key|extra/i],
			['dilute', { stockPercentVol: 70, targetPercentVol: 80, targetVolumeMl: 1000 }, /cannot be stronger than the stock/],
			['jar', { jar: { shape: 'oval', widthMm: 80, depthMm: 120, heightMm: 100 } }, /minor axis/],
			['trend', { points: [{ date: '12/03/2020', value: 1 }] }, /YYYY-MM-DD/],
		];
		for (const [path, json, message] of cases) {
			const res = await post(path, json);
			expect(res.status, `${path} ${JSON.stringify(json)}`).toBe(400);
			const body = await res.json();
			expect([body.error, ...body.fields.map((f: { message: string }) => f.message)].join(' '), path).toMatch(message);
		}
	});

	it('refuses a body that is not JSON, and one too large', async () => {
		const notJson = await call('/api/fluid/strength', { cookie, method: 'POST', headers: { 'content-type': 'application/json' } });
		expect(notJson.status).toBe(400);
		const huge = await post('trend', { points: [], pad: 'x'.repeat(300_000) });
		expect(huge.status).toBe(413);
	});
});
