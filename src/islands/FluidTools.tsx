import { QueryRoot } from './QueryRoot.tsx';
import { StrengthCalculator } from './fluid/StrengthCalculator.tsx';
import { MixCalculator } from './fluid/MixCalculator.tsx';
import { TopUpCalculator } from './fluid/TopUpCalculator.tsx';
import { WaterCalculator } from './fluid/WaterCalculator.tsx';
import { JarCalculator } from './fluid/JarCalculator.tsx';
import { TrendCalculator } from './fluid/TrendCalculator.tsx';

/** The Fluid tools page: every calculator; the check page reuses them one by one. */
export default function FluidTools() {
	return (
		<QueryRoot>
			<div className="grid gap-6 lg:grid-cols-2">
				<StrengthCalculator />
				<MixCalculator />
				<WaterCalculator />
				<TopUpCalculator />
				<TrendCalculator />
				<JarCalculator />
			</div>
		</QueryRoot>
	);
}
