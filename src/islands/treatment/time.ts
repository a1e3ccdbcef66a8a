/** ISO instants ↔ the value of a datetime-local input, in the browser's own time zone. */
export function toLocalInput(iso: string | null): string {
	if (!iso) return '';
	const d = new Date(iso);
	const p = (n: number) => String(n).padStart(2, '0');
	return `${d.getFullYear()}-${p(d.getMonth() + 1)}-${p(d.getDate())}T${p(d.getHours())}:${p(d.getMinutes())}`;
}

export function fromLocalInput(v: string): string | null {
	if (!v) return null;
	const t = new Date(v).getTime();
	return Number.isFinite(t) ? new Date(t).toISOString() : null;
}

export const shown = (iso: string | null) => (iso ? new Date(iso).toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' }) : '—');
