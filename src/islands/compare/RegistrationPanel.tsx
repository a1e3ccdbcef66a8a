import type { Registration } from '../../lib/compare/analysis.ts';
import { MODEL_LABEL, MODELS, type ControlPair, type RegistrationModel } from '../../lib/compare/schema.ts';

/**
 * The control points and the fit: which model, each pair's error after the fit (px of the earlier
 * photograph), the overall RMS, the pairs the fit flags as likely misplaced, and why there is no
 * fit when there is none.
 */
interface Props {
	model: RegistrationModel;
	onModel: (m: RegistrationModel) => void;
	pairs: ControlPair[];
	pending: { n: number; before?: readonly [number, number]; after?: readonly [number, number] } | null;
	registration: Registration;
	markedPairs: number;
	onUseMarked: () => void;
	onRemove: (n: number) => void;
	onClear: () => void;
}

const px = (v: number) => `${v.toLocaleString('en-GB', { maximumFractionDigits: 1, minimumFractionDigits: 1 })} px`;

export function RegistrationPanel({ model, onModel, pairs, pending, registration, markedPairs, onUseMarked, onRemove, onClear }: Props) {
	const errors = registration.residuals?.errors ?? [];
	const flagged = new Set(registration.residuals?.bad.map((b) => b.n) ?? []);
	return (
		<section className="card space-y-3" aria-labelledby="reg-heading" data-testid="registration">
			<h2 id="reg-heading" className="text-lg">Lining up</h2>
			<fieldset className="space-y-1">
				<legend className="text-sm font-semibold">Registration</legend>
				{MODELS.map((m) => (
					<label key={m} className="flex items-center gap-2 text-sm">
						<input type="radio" name="model" value={m} checked={model === m} onChange={() => onModel(m)} />
						{MODEL_LABEL[m]}
					</label>
				))}
			</fieldset>
			<p className="text-sm text-ink-600">
				In <strong>Match points</strong>, click a feature on the earlier photograph, then the same feature on the later one: the scale bar's ends, the grey card's corners, a mark on the glass. Spread them out.
			</p>
			{pending && (
				<p className="notice-caution text-sm" role="status">
					Pair {pending.n}: {pending.before ? 'now click the same feature on the later photograph.' : 'now click it on the earlier photograph.'}
				</p>
			)}
			{pairs.length > 0 && (
				<table className="w-full text-sm" data-testid="pairs">
					<thead>
						<tr className="text-left text-ink-600">
							<th className="font-normal">Pair</th>
							<th className="font-normal">Error</th>
							<th className="sr-only">Remove</th>
						</tr>
					</thead>
					<tbody>
						{pairs.map((p, i) => (
							<tr key={p.n} className={flagged.has(p.n) ? 'text-alert-700' : ''}>
								<td>{p.n}</td>
								<td>
									{errors[i] !== undefined ? px(errors[i]!) : '–'}
									{flagged.has(p.n) && <strong> · check this pair</strong>}
								</td>
								<td className="text-right">
									<button type="button" className="underline" onClick={() => onRemove(p.n)} aria-label={`Remove pair ${p.n}`}>
										Remove
									</button>
								</td>
							</tr>
						))}
					</tbody>
				</table>
			)}
			<div data-testid="registration-result" className="text-sm">
				{registration.problem && <p className="notice-caution">{registration.problem} Compared unaligned meanwhile.</p>}
				{registration.residuals && (
					<p>
						Fitted on {pairs.length} pairs: overall error (RMS) <strong data-testid="rms">{px(registration.residuals.rms)}</strong>
						{registration.residuals.bad.length > 0 && <span className="text-alert-700"> · {registration.residuals.bad.length} pair(s) flagged: more than {px(registration.residuals.limitPx)} off</span>}.
					</p>
				)}
				{registration.note && <p className="text-ink-600">{registration.note}</p>}
			</div>
			<div className="flex flex-wrap gap-2">
				{markedPairs >= 3 && (
					<button type="button" className="btn-secondary" onClick={onUseMarked}>
						Use the {markedPairs} control points marked on both photos
					</button>
				)}
				{pairs.length > 0 && (
					<button type="button" className="btn-secondary" onClick={onClear}>
						Clear the points
					</button>
				)}
			</div>
		</section>
	);
}
