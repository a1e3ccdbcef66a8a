import { useCallback, useEffect, useRef, useState } from 'react';
import { api } from '../../lib/client/api.ts';

/**
 * Follows uploads after their last byte: the worker checks and prepares each file, and this asks
 * the server where each one is until it is recorded, refused or quarantined.
 */
export interface Verdict {
	id: string;
	fileName: string;
	state: 'receiving' | 'processing' | 'recorded' | 'refused' | 'quarantined';
	label: string;
	reason: string | null;
	photoId: string | null;
}

const SETTLED = new Set(['recorded', 'refused', 'quarantined']);

export function useUploadVerdicts(onSettled: (v: Verdict) => void) {
	const [verdicts, setVerdicts] = useState<Record<string, Verdict>>({});
	const pending = useRef(new Set<string>());
	const settledCb = useRef(onSettled);
	settledCb.current = onSettled;

	const follow = useCallback((id: string, fileName: string) => {
		pending.current.add(id);
		setVerdicts((v) => ({ ...v, [id]: { id, fileName, state: 'receiving', label: 'Waiting to be checked', reason: null, photoId: null } }));
	}, []);

	useEffect(() => {
		const timer = setInterval(async () => {
			const ids = [...pending.current];
			if (ids.length === 0) return;
			try {
				const { uploads } = await api<{ uploads: Verdict[] }>(`/api/uploads/status?${ids.map((i) => `id=${i}`).join('&')}`);
				for (const u of uploads) {
					if (SETTLED.has(u.state)) {
						pending.current.delete(u.id);
						settledCb.current(u);
					}
				}
				setVerdicts((v) => ({ ...v, ...Object.fromEntries(uploads.map((u) => [u.id, u])) }));
			} catch {
				// Offline for a moment: ask again on the next tick.
			}
		}, 1200);
		return () => clearInterval(timer);
	}, []);

	return { verdicts: Object.values(verdicts), follow };
}
