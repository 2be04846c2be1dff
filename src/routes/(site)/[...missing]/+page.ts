import { error } from '@sveltejs/kit';

// Any path no other route answers: render the site's 404 page inside the site layout.
export const prerender = false;
export const csr = false;

export const load = () => {
	error(404, 'Page not found');
};
