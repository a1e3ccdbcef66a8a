import { useCallback, useEffect, useRef, useState } from 'react';
import type { MarkLayer } from '../../lib/marks/schema.ts';

/**
 * Keeps the server's copy of a mark layer in step with the editor: a save a moment after each
 * change, one at a time, naming the version it builds on; a copy in localStorage until the server
 * has it, so a closed tab or a dropped connection loses nothing (it is offered back on the next
 * visit); a retry when the connection returns; and on a refused save (someone else saved first)
 * the state 'conflict' with their layer, for the editor to merge or reload.
 */
export type SyncState = 'saved' | 'unsaved' | 'saving' | 'offline' | 'conflict' | 'error';

export interface Remote {
	layer: MarkLayer;
	version: number;
}

interface Pending {
	photoId: string;
	baseVersion: number;
	base: MarkLayer;
	layer: MarkLayer;
	at: string;
}

const DELAY_MS = 800;
const storageKey = (photoId: string) => `meniscus-marks-${photoId}`;

export function readPending(photoId: string): Pending | null {
	try {
		const raw = localStorage.getItem(storageKey(photoId));
		return raw ? (JSON.parse(raw) as Pending) : null;
	} catch {
		return null;
	}
}

export function useLayerSync(photoId: string, initial: Remote, enabled: boolean) {
	const [state, setState] = useState<SyncState>('saved');
	const [message, setMessage] = useState<string | null>(null);
	const [conflict, setConflict] = useState<Remote | null>(null);
	const server = useRef<Remote>(initial);
	const wanted = useRef<MarkLayer>(initial.layer);
	const timer = useRef<ReturnType<typeof setTimeout> | null>(null);
	const inFlight = useRef(false);

	const remember = () => {
		const p: Pending = { photoId, baseVersion: server.current.version, base: server.current.layer, layer: wanted.current, at: new Date().toISOString() };
		try {
			localStorage.setItem(storageKey(photoId), JSON.stringify(p));
		} catch {
			// Storage full or disabled: the save itself still runs.
		}
	};
	const forget = () => {
		try {
			localStorage.removeItem(storageKey(photoId));
		} catch {}
	};

	const flush = useCallback(async () => {
		if (!enabled || inFlight.current || wanted.current === server.current.layer) return;
		inFlight.current = true;
		const layer = wanted.current;
		setState('saving');
		try {
			const res = await fetch(`/api/photos/${photoId}/marks`, {
				method: 'PUT',
				credentials: 'same-origin',
				headers: { 'content-type': 'application/json', accept: 'application/json' },
				body: JSON.stringify({ version: server.current.version, layer }),
			});
			const body = await res.json().catch(() => null);
			if (res.ok) {
				server.current = { layer, version: body.version };
				if (wanted.current === layer) {
					forget();
					setState('saved');
					setMessage(null);
				} else setState('unsaved');
			} else if (res.status === 409 && body?.current) {
				setConflict({ layer: body.current.layer, version: body.current.version });
				setState('conflict');
				setMessage(body.error);
			} else {
				setState('error');
				setMessage(body?.error ?? `The server answered ${res.status}.`);
			}
		} catch {
			setState('offline');
			setMessage('Offline: your marks are kept in this browser and will be saved when the connection returns.');
		} finally {
			inFlight.current = false;
		}
		// Changes made while this save was on its way go next.
		if (wanted.current !== server.current.layer && !timer.current) timer.current = setTimeout(run, DELAY_MS);
	}, [photoId, enabled]);

	const run = useCallback(() => {
		timer.current = null;
		void flush();
	}, [flush]);

	/** The editor calls this with every new layer state. */
	const changed = useCallback(
		(layer: MarkLayer) => {
			if (!enabled) return;
			wanted.current = layer;
			remember();
			setState((s) => (s === 'conflict' || s === 'offline' ? s : 'unsaved'));
			if (timer.current) clearTimeout(timer.current);
			timer.current = setTimeout(run, DELAY_MS);
		},
		// eslint-disable-next-line react-hooks/exhaustive-deps
		[enabled, run],
	);

	/** After a conflict: build on their version with the given (merged or their own) layer. */
	const resolve = useCallback(
		(layer: MarkLayer) => {
			if (!conflict) return;
			server.current = conflict;
			setConflict(null);
			setState('unsaved');
			setMessage(null);
			wanted.current = layer;
			remember();
			void flush();
		},
		// eslint-disable-next-line react-hooks/exhaustive-deps
		[conflict, flush],
	);

	useEffect(() => {
		const online = () => {
			if (wanted.current !== server.current.layer) void flush();
		};
		// Leaving the page: one last save that outlives it (keepalive), and the local copy either way.
		const leave = () => {
			if (!enabled || wanted.current === server.current.layer) return;
			remember();
			const body = JSON.stringify({ version: server.current.version, layer: wanted.current });
			if (body.length < 60_000) {
				void fetch(`/api/photos/${photoId}/marks`, { method: 'PUT', keepalive: true, credentials: 'same-origin', headers: { 'content-type': 'application/json' }, body }).catch(() => {});
			}
		};
		const retry = setInterval(() => {
			if (navigator.onLine && (state === 'offline' || state === 'error') && wanted.current !== server.current.layer) void flush();
		}, 10_000);
		window.addEventListener('online', online);
		window.addEventListener('pagehide', leave);
		return () => {
			clearInterval(retry);
			window.removeEventListener('online', online);
			window.removeEventListener('pagehide', leave);
		};
		// eslint-disable-next-line react-hooks/exhaustive-deps
	}, [photoId, enabled, flush, state]);

	return { state, message, conflict, changed, resolve, base: () => server.current };
}
