/**
 * The homeowner's link pages (estimate, visit, change order, payment, invoice, testimonial,
 * seasonal care) open from a private token in the URL: never cached by a browser or proxy,
 * never indexed, and the address (with its token) never sent to another site as a referrer.
 * `same-origin` rather than `no-referrer`: under `no-referrer` the browser sends `Origin: null`
 * with the page's own form posts, and the framework's cross-site check refuses them.
 */
export const LINK_PAGE_HEADERS = {
	'cache-control': 'private, no-store',
	'x-robots-tag': 'noindex',
	'referrer-policy': 'same-origin'
} as const;
