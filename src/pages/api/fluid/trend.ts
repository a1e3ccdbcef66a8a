import { calculator } from '../../../lib/server/fluid/calculator.ts';
import { TrendInput } from '../../../lib/fluid/schema.ts';
import { forecastReach, trend } from '../../../lib/fluid/trend.ts';

/** The rate of change of dated readings, and when a falling level reaches a line. */
export const POST = calculator(TrendInput, (i) => {
	const t = trend(i.points, i.unit);
	const mlPerYear = 'perYear' in t && i.mlPerMm ? t.perYear * i.mlPerMm : null;
	const forecast = i.unit === 'mm' && i.lineMm !== null && i.lineMm !== undefined ? forecastReach(i.points, i.lineMm) : null;
	return { trend: t, mlPerYear, forecast };
});
