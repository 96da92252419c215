import type { SessionUser, UserSession } from '$lib/server/auth/session';

declare global {
	namespace App {
		interface Error {
			message: string;
			requestId?: string;
		}
		interface Locals {
			requestId: string;
			user: SessionUser | null;
			session: UserSession | null;
		}
	}
}

export {};
