// Loaded with `node --import` into every Node process a launcher starts (the app, the test
// runners and what they start in turn), and into the launchers themselves: when the parent goes
// away, even by `kill -9`, which it cannot catch, the process stops as on Ctrl-C instead of
// living on and holding its port. The same when one of the wrappers above it goes (`npm`, the
// `sh -c` it runs, `tsx`): a SIGTERM to `npm start` kills npm and its shell, but that shell does
// not pass the signal on. A process that does not stop within 10 seconds of that is killed.
import { readFileSync } from 'node:fs';
import { basename } from 'node:path';

/** Fields of /proc/<pid>/stat after the command name: [state, ppid, …, starttime at 19]. */
function stat(pid) {
	try {
		const text = readFileSync(`/proc/${pid}/stat`, 'utf8');
		return text.slice(text.lastIndexOf(')') + 2).split(' ');
	} catch {
		return null;
	}
}

function args(pid) {
	try {
		return readFileSync(`/proc/${pid}/cmdline`, 'utf8').split('\0');
	} catch {
		return [];
	}
}

function isWrapper(argv) {
	// npm rewrites its title ("npm run services"), which is then one string.
	const program = basename((argv[0] ?? '').split(' ')[0]);
	if (program === 'npm' || program === 'npx') return true;
	if (['sh', 'dash', 'bash'].includes(program) && argv[1] === '-c') {
		return /\b(tsx|npm|npx)\b/.test(argv[2] ?? '');
	}
	return (
		program.startsWith('node') &&
		argv.some((a) => /(\/\.bin\/tsx|tsx\/dist\/cli\.m?js|npm-cli\.js|npx-cli\.js)$/.test(a))
	);
}

/** The parent, then each wrapper above it, each named by pid and start time. */
function watchedAncestors() {
	const chain = [];
	let pid = process.ppid;
	while (pid > 1) {
		const fields = stat(pid);
		if (!fields) break;
		chain.push({ pid, startTime: fields[19] });
		pid = Number(fields[1]);
		if (!isWrapper(args(pid))) break;
	}
	return chain;
}

const ancestors = watchedAncestors();
const parent = process.ppid;
const gone = ({ pid, startTime }) => {
	const fields = stat(pid);
	return !fields || fields[19] !== startTime || fields[0] === 'Z';
};

const watch = setInterval(() => {
	if (process.ppid === parent && !ancestors.some(gone)) return;
	clearInterval(watch);
	setTimeout(() => process.kill(process.pid, 'SIGKILL'), 10_000).unref();
	process.kill(process.pid, 'SIGTERM');
}, 500);
watch.unref();
