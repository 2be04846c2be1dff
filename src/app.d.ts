import type { SessionUser, SessionInfo } from '$lib/server/auth/sessions';

declare global {
	namespace App {
		interface Locals {
			user: SessionUser | null;
			session: SessionInfo | null;
		}
		interface Error {
			message: string;
			code?: string;
		}
	}
}

export {};
