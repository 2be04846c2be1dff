/** Only same-site office paths are followed after sign-in, never another host. */
export function safeNext(next: string | null | undefined): string {
	if (!next || !next.startsWith('/office') || next.startsWith('//')) return '/office';
	return next;
}
