declare global {
	namespace App {
		interface Locals {
			user: { id: string; email: string; name: string } | null;
			/** How the caller proved who they are. */
			via?: 'cookie' | 'token';
		}
		interface Error {
			message: string;
			code?: string;
		}
	}
}

export {};
