// Loaded with `node --import` into every Node process a launcher starts (the app, the test
// runners and what they start in turn), and into the launchers themselves: when the parent goes
// away, even by `kill -9`, which it cannot catch, the process stops as on Ctrl-C instead of
// living on and holding its port. Linux hands an orphan to another parent: a changed parent pid
// tells. A process that does not stop within 10 seconds of that is killed.
const parent = process.ppid;

const watch = setInterval(() => {
	if (process.ppid === parent) return;
	clearInterval(watch);
	setTimeout(() => process.kill(process.pid, 'SIGKILL'), 10_000).unref();
	process.kill(process.pid, 'SIGTERM');
}, 500);
watch.unref();
