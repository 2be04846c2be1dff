// Errors the launchers expect (a busy port, a full disk, missing binaries…): their message is one
// sentence saying what is wrong and what to do, printed without a stack trace.
export class LauncherError extends Error {}

/** One sentence for a full disk, or null when the error or tool output is about something else. */
export function diskFullMessage(problem: unknown, where: string): string | null {
	const text =
		problem instanceof Error
			? `${(problem as NodeJS.ErrnoException).code ?? ''} ${problem.message}`
			: String(problem);
	if (!/ENOSPC|No space left on device|could not extend file/i.test(text)) return null;
	return `The disk holding ${where} is full: free some space on it, then start again.`;
}

/** Prints an expected failure as its one sentence (anything else with its stack) and exits 1. */
export function exitWithError(error: unknown): never {
	const full = diskFullMessage(error, process.cwd());
	if (error instanceof LauncherError) console.error(error.message);
	else if (full) console.error(full);
	else console.error(error);
	process.exit(1);
}
