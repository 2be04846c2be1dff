import adapter from '@sveltejs/adapter-node';
import { vitePreprocess } from '@sveltejs/vite-plugin-svelte';
import { mdsvex } from 'mdsvex';

// Where the browser may also load images from or post to: the photo bucket's signed URLs and
// the payment provider's checkout. Locally both are stand-ins on loopback.
const extraOrigins = (process.env.CSP_EXTRA_ORIGINS ?? 'http://127.0.0.1:*')
	.split(/\s+/)
	.filter(Boolean);

/** @type {import('@sveltejs/kit').Config} */
const config = {
	extensions: ['.svelte', '.md'],
	preprocess: [vitePreprocess(), mdsvex({ extensions: ['.md'] })],
	kit: {
		adapter: adapter({ out: process.env.BUILD_DIR ?? 'build' }),
		alias: { $content: 'content' },
		csp: {
			mode: 'auto',
			directives: {
				'default-src': ['self'],
				'script-src': ['self'],
				'style-src': ['self', 'unsafe-inline'],
				'img-src': ['self', 'data:', 'blob:', ...extraOrigins],
				'font-src': ['self'],
				'connect-src': ['self'],
				'form-action': ['self', ...extraOrigins],
				'frame-ancestors': ['none'],
				'base-uri': ['self'],
				'object-src': ['none']
			}
		}
	}
};

export default config;
