/**
 * The fields whose values differ between two versions of a record, for the audit trail and for
 * telling someone what changed while they were editing.
 */
export function changedFields<T extends Record<string, unknown>>(before: T, after: T, ignore: readonly string[] = []) {
	const keys = new Set([...Object.keys(before), ...Object.keys(after)]);
	const out: { field: string; before: unknown; after: unknown }[] = [];
	for (const k of keys) {
		if (ignore.includes(k)) continue;
		if (JSON.stringify(before[k]) !== JSON.stringify(after[k])) out.push({ field: k, before: before[k] ?? null, after: after[k] ?? null });
	}
	return out;
}
