// The public forms check what was typed in the browser before it goes (the same zod schema the
// server reads it with), so a slip shows beside its field at once instead of after a round trip.
import type { SubmitFunction } from '@sveltejs/kit';

type Problems = Record<string, string>;

/**
 * A `use:enhance` callback: what `check` finds stops the post, goes to `show` (to sit beside the
 * fields) and takes the focus to the first field marked; else the form is posted, `busy` while it
 * is on its way, and keeps what was typed when the answer comes back.
 */
export function checkFirst(
	check: (data: FormData, action: URL) => Problems | null,
	show: (problems: Problems | null) => void,
	busy: (on: boolean) => void
): SubmitFunction {
	return ({ formData, action, cancel }) => {
		const found = check(formData, action);
		if (found) {
			cancel();
			show(found);
			requestAnimationFrame(() =>
				document.querySelector<HTMLElement>('[aria-invalid="true"], .field-error')?.focus()
			);
			return;
		}
		show(null);
		busy(true);
		return async ({ update }) => {
			await update({ reset: false });
			busy(false);
		};
	};
}
