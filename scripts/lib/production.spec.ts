import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { SERVER_ENV, SERVER_NODE_FLAGS, serverEnv } from './production';

const pkg = JSON.parse(readFileSync(join(import.meta.dirname, '..', '..', 'package.json'), 'utf8'));
const serve: string = pkg.scripts.serve;

describe('the production server settings', () => {
	it('`npm run serve` starts Node with the same heap flags as `npm start`', () => {
		const nodeArgs = serve.slice(serve.indexOf(' node ') + 6).split(' ');
		expect(nodeArgs.slice(0, SERVER_NODE_FLAGS.length)).toEqual([...SERVER_NODE_FLAGS]);
		expect(nodeArgs.slice(SERVER_NODE_FLAGS.length)).toEqual(['scripts/serve.js', 'build']);
	});

	it('`npm run serve` sets every server variable, keeping a value the operator already set', () => {
		for (const [name, value] of Object.entries(SERVER_ENV)) {
			expect(serve).toContain(`${name}=\${${name}:-${value}}`);
		}
		expect(serverEnv({ DATABASE_POOL_SIZE: '12' })).toMatchObject({
			DATABASE_POOL_SIZE: '12',
			MALLOC_ARENA_MAX: '2'
		});
	});
});
