/// <reference types="astro/client" />

declare namespace App {
	interface Locals {
		/** The signed-in user, read afresh from the database on this request; null when signed out. */
		user: import('./lib/server/auth/lucia.ts').SignedInUser | null;
		sessionId: string | null;
	}
}
