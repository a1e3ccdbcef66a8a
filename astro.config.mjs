// @ts-check
import { defineConfig } from 'astro/config';
import node from '@astrojs/node';
import react from '@astrojs/react';
import tailwind from '@astrojs/tailwind';

/**
 * Hosts the built server answers for. Astro ignores the Host header unless it is listed here, and
 * then every form POST fails the origin check and absolute URLs point at localhost (STACK.md).
 * Loopback is always allowed (any port, so tests can use free ports); deployments add their public
 * host names, comma-separated, in MENISCUS_ALLOWED_HOSTS at build time.
 */
const extraHosts = (process.env.MENISCUS_ALLOWED_HOSTS ?? '')
	.split(',')
	.map((h) => h.trim())
	.filter(Boolean);

export default defineConfig({
	output: 'server',
	adapter: node({ mode: 'standalone' }),
	integrations: [react(), tailwind({ applyBaseStyles: false })],
	security: {
		checkOrigin: true,
		allowedDomains: [
			{ hostname: '127.0.0.1' },
			{ hostname: 'localhost' },
			...extraHosts.map((hostname) => ({ hostname })),
		],
	},
	server: { host: '127.0.0.1', port: 4321 },
	devToolbar: { enabled: false },
	// A hashed Content-Security-Policy for every page: scripts and styles only from this site or with
	// the hash Astro computed at build, so injected markup cannot run (ASVS 3.4.3).
	experimental: { csp: true },
	vite: {
		// Server-only packages with native parts or dynamic requires stay outside the bundle.
		ssr: { external: ['@node-rs/argon2', 'pg', 'pg-hstore', 'sequelize', 'nodemailer'] },
	},
});
