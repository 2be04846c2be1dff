// What care's routes need of the request.
/** The caller's address for the acceptance record, or null where the adapter cannot tell. */
export function clientAddress(event: { getClientAddress: () => string }): string | null {
	try {
		return event.getClientAddress();
	} catch {
		return null;
	}
}
