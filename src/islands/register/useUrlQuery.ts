import { useCallback, useEffect, useState } from 'react';
import { parseRegisterQuery, registerQueryToParams, RegisterQuerySchema, type RegisterQuery } from '../../lib/specimen/query.ts';

/**
 * The register's view kept in the address bar, so a filtered, sorted page can be bookmarked and
 * shared, and Back returns to the previous view.
 */
function read(): RegisterQuery {
	const parsed = parseRegisterQuery(new URLSearchParams(window.location.search));
	return parsed.success ? parsed.data : RegisterQuerySchema.parse({});
}

export function useUrlQuery() {
	const [query, setQuery] = useState<RegisterQuery>(read);
	useEffect(() => {
		const onPop = () => setQuery(read());
		window.addEventListener('popstate', onPop);
		return () => window.removeEventListener('popstate', onPop);
	}, []);
	const update = useCallback((change: Partial<RegisterQuery>, opts: { resetPage?: boolean } = { resetPage: true }) => {
		setQuery((q) => {
			const next = { ...q, ...change, ...(opts.resetPage && !('page' in change) ? { page: 1 } : {}) };
			const search = registerQueryToParams(next).toString();
			window.history.pushState(null, '', search ? `?${search}` : window.location.pathname);
			return next;
		});
	}, []);
	return { query, update, params: registerQueryToParams(query) };
}
