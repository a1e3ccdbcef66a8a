import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { useState, type ReactNode } from 'react';

/** Each island is its own React root, so each gets a query client (TanStack Query). */
export function QueryRoot({ children }: { children: ReactNode }) {
	const [client] = useState(
		() => new QueryClient({ defaultOptions: { queries: { retry: 1, refetchOnWindowFocus: false, staleTime: 15_000 } } }),
	);
	return <QueryClientProvider client={client}>{children}</QueryClientProvider>;
}
