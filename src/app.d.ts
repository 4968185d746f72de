declare global {
	namespace App {
		interface Locals {
			user: { id: string; email: string; name: string } | null;
			/** How the caller proved who they are. */
			via?: 'cookie' | 'token';
			/** The browser session the cookie names (cookie callers only). */
			sessionId?: string;
		}
		interface Error {
			message: string;
			code?: string;
		}
	}
}

declare module '@auth/core/types' {
	interface Session {
		sessionId?: string;
	}
}

export {};
