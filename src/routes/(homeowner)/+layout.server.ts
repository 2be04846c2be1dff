import { LINK_PAGE_HEADERS } from '$lib/server/http/link-pages';
import type { LayoutServerLoad } from './$types';

export const load: LayoutServerLoad = ({ setHeaders }) => {
	setHeaders(LINK_PAGE_HEADERS);
};
