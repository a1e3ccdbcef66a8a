import type { ContainerMaterial } from '../../fluid/airspace.ts';
import type { Jar, JarShape } from '../../fluid/jar.ts';
import { AIRSPACE_KINDS, airspaceFluid, airspaceVerdict, DEFAULT_FILL_TEMP_C, MAX_EXPANSION_PER_K, saferStores, type Store } from '../../overview/airspaceRisk.ts';
import { jarFluidMl, jarsFluidMl, limitStatus } from '../../overview/inventory.ts';
import type { AtRiskRow, InventoryRow, Overview, OverviewQuery } from '../../overview/schema.ts';
import type { PreservativeKind } from '../../specimen/vocabulary.ts';
import { StorageLocation } from '../models/index.ts';
import { latestLevelSql, scopeSql, select } from './scope.ts';
import { countedFlammableSql, spiritSql, trustedCheckSql } from './sql.ts';

/**
 * Per store: the flammable fluid its jars hold against its limit, and the jars whose airspace is too
 * small for its warmest temperature. Both read each jar's latest trusted level.
 */

/** At most this many jars near the lid are judged, and this many at risk are listed. */
export const AIRSPACE_CANDIDATES = 500;
export const AIRSPACE_LIST_LENGTH = 50;

const latest = latestLevelSql('s', trustedCheckSql('c'));

type Group = { loc: string; shape: JarShape; w: number; d: number | null; h: number; class: 'spirit' | 'presumed'; in_collection: boolean; jars: string; without_level: string; level_sum: number };

/**
 * Store totals, for every store (the location filter only chooses which rows are shown, since the
 * room left in other stores matters to a jar that should move). The sum runs in SQL by store and jar
 * size (volume is linear in the level), so only one row per distinct jar size reaches JavaScript,
 * which applies the jar geometry to it. A store's total counts every jar in it whatever the
 * collection filter, since its limit is the whole store's; the chosen collection's part is beside it.
 */
export async function inventory(q: OverviewQuery, locations: StorageLocation[]): Promise<InventoryRow[]> {
	const groups = await select<Group>(
		`SELECT s.storage_location_id AS loc, s.container_shape AS shape, s.inner_width_mm::float8 AS w, s.inner_depth_mm::float8 AS d,
		        s.inner_height_mm::float8 AS h, CASE WHEN ${spiritSql('s')} THEN 'spirit' ELSE 'presumed' END AS class,
		        ${q.collection ? 's.department = :collection' : 'false'} AS in_collection,
		        count(*) AS jars, count(*) FILTER (WHERE lv.level IS NULL) AS without_level,
		        sum(LEAST(COALESCE(lv.level, s.inner_height_mm::float8), s.inner_height_mm::float8)) AS level_sum
		 FROM specimens s ${latest}
		 WHERE s.deleted_at IS NULL AND s.storage_location_id IS NOT NULL AND ${countedFlammableSql('s')}
		 GROUP BY 1, 2, 3, 4, 5, 6, 7`,
		q,
	);
	const totals = new Map<string, { jars: number; spiritMl: number; presumedMl: number; withoutLevel: number; collectionMl: number }>();
	for (const g of groups) {
		const t = totals.get(g.loc) ?? { jars: 0, spiritMl: 0, presumedMl: 0, withoutLevel: 0, collectionMl: 0 };
		const ml = jarsFluidMl({ shape: g.shape, widthMm: g.w, depthMm: g.d, heightMm: g.h }, Number(g.level_sum));
		t.jars += Number(g.jars);
		t.withoutLevel += Number(g.without_level);
		if (g.class === 'spirit') t.spiritMl += ml;
		else t.presumedMl += ml;
		if (g.in_collection) t.collectionMl += ml;
		totals.set(g.loc, t);
	}
	return locations.map((l) => {
		const t = totals.get(l.id) ?? { jars: 0, spiritMl: 0, presumedMl: 0, withoutLevel: 0, collectionMl: 0 };
		return {
			location: { id: l.id, code: l.code, name: l.name },
			...t,
			collectionMl: q.collection ? t.collectionMl : null,
			limitL: l.flammableLimitL,
			nearLimitPercent: l.nearLimitPercent,
			...limitStatus(t.spiritMl + t.presumedMl, l.flammableLimitL, l.nearLimitPercent),
		};
	});
}

type NearFull = {
	id: string;
	object_number: string;
	title: string;
	shape: JarShape;
	w: number;
	d: number | null;
	h: number;
	material: ContainerMaterial;
	kind: PreservativeKind;
	flammable: boolean;
	loc: string;
	level: number;
	temp_c: number | null;
	real: number | null;
	checked_on: string;
};

/**
 * Jars whose latest level is above the safe level for their store's warmest temperature. SQL keeps
 * only jars that could be at risk whatever their strength (couldBeAtRisk, with the expansion bound);
 * airspace() then judges each. The filling temperature is the reading's own, or 20 °C without one.
 */
export async function airspaceAtRisk(q: OverviewQuery, locations: StorageLocation[], allStores: InventoryRow[]): Promise<Overview['airspace']> {
	const kinds = AIRSPACE_KINDS.map((k) => `'${k}'`).join(', ');
	const rows = await select<NearFull>(
		`SELECT s.id, s.object_number, s.title, s.container_shape AS shape, s.inner_width_mm::float8 AS w, s.inner_depth_mm::float8 AS d,
		        s.inner_height_mm::float8 AS h, s.container_material AS material, s.preservative_kind AS kind, ${countedFlammableSql('s')} AS flammable,
		        l.id AS loc, lv.level, lv.temp_c, lv.real, lv.checked_on
		 FROM specimens s JOIN storage_locations l ON l.id = s.storage_location_id AND l.temp_max_c IS NOT NULL ${latest}
		 WHERE s.deleted_at IS NULL AND s.preservative_kind IN (${kinds})${scopeSql(q)}
		   AND lv.level <= s.inner_height_mm
		   AND lv.level > s.inner_height_mm / (1 + :bound * GREATEST(l.temp_max_c - COALESCE(lv.temp_c, :fill), 0))
		 ORDER BY s.object_number LIMIT :cap`,
		q,
		{ bound: MAX_EXPANSION_PER_K, fill: DEFAULT_FILL_TEMP_C, cap: AIRSPACE_CANDIDATES },
	);
	const byId = new Map(locations.map((l) => [l.id, l]));
	const room = new Map(allStores.map((r) => [r.location.id, r.limitL === null ? null : r.limitL * 1000 - r.spiritMl - r.presumedMl]));
	const stores: Store[] = locations
		.filter((l) => l.tempMaxC !== null)
		.map((l) => ({ id: l.id, code: l.code, name: l.name, tempMaxC: l.tempMaxC!, roomMl: room.has(l.id) ? room.get(l.id)! : null }));
	const atRisk: AtRiskRow[] = [];
	for (const r of rows) {
		const store = byId.get(r.loc)!;
		const fluid = airspaceFluid(r.kind, r.real);
		if (!fluid) continue;
		const jar: Jar = { shape: r.shape, widthMm: r.w, depthMm: r.d, heightMm: r.h };
		const fill = { jar, material: r.material, percentVol: fluid.percentVol, levelMm: r.level, fillTempC: r.temp_c ?? DEFAULT_FILL_TEMP_C };
		let verdict;
		try {
			verdict = airspaceVerdict(fill, store.tempMaxC!);
		} catch (err) {
			// A reading outside the OIML formula's range cannot be judged; skip it rather than guess.
			if (err instanceof RangeError) continue;
			throw err;
		}
		if (!verdict.atRisk) continue;
		const safer = saferStores(fill, store.tempMaxC!, stores, { fluidMl: jarFluidMl(jar, r.level), flammable: r.flammable });
		atRisk.push({
			id: r.id,
			objectNumber: r.object_number,
			title: r.title,
			location: { id: store.id, code: store.code, name: store.name },
			warmestC: store.tempMaxC!,
			levelMm: r.level,
			checkedOn: r.checked_on,
			innerHeightMm: r.h,
			fillTempC: fill.fillTempC,
			fillTempAssumed: r.temp_c === null,
			percentVol: fluid.percentVol,
			fluidBasis: fluid.basis,
			safeLevelMm: verdict.safeLevelMm,
			drawOffMm: verdict.drawOffMm,
			drawOffMl: verdict.drawOffMl,
			saferStores: safer.map((s) => ({ id: s.id, code: s.code, name: s.name, tempMaxC: s.tempMaxC })),
		});
	}
	atRisk.sort((a, b) => b.drawOffMm - a.drawOffMm || a.objectNumber.localeCompare(b.objectNumber));
	return {
		rows: atRisk.slice(0, AIRSPACE_LIST_LENGTH),
		truncated: atRisk.length > AIRSPACE_LIST_LENGTH || rows.length >= AIRSPACE_CANDIDATES,
		locationsWithoutTemperature: locations.filter((l) => l.tempMaxC === null && (!q.location || l.id === q.location)).length,
	};
}
