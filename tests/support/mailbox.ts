// Reads what the app sent through the maildev stand-in's REST API.
const api = () => process.env.TEST_MAIL_API ?? 'http://127.0.0.1:1090/api';

export interface CaughtMail {
	id: string;
	subject: string;
	text: string;
	html: string;
	to: { address: string }[];
	attachments?: { fileName?: string; filename?: string; contentType: string; size?: number }[];
}

export async function allMail(): Promise<CaughtMail[]> {
	const res = await fetch(`${api()}/email`);
	if (!res.ok) throw new Error(`mail API answered ${res.status}`);
	return res.json();
}

export async function clearMail(): Promise<void> {
	await fetch(`${api()}/email/all`, { method: 'DELETE' });
}

/** Waits for a message to `to` whose subject matches, newest first. */
export async function waitForMail(
	to: string,
	subject: RegExp,
	timeoutMs = 15_000
): Promise<CaughtMail> {
	const deadline = Date.now() + timeoutMs;
	while (Date.now() < deadline) {
		const found = (await allMail())
			.reverse()
			.find(
				(m) =>
					m.to.some((t) => t.address.toLowerCase() === to.toLowerCase()) && subject.test(m.subject)
			);
		if (found) return found;
		await new Promise((r) => setTimeout(r, 200));
	}
	throw new Error(`no mail to ${to} matching ${subject} within ${timeoutMs} ms`);
}

export function linkIn(mail: CaughtMail, path: RegExp): string {
	const urls = mail.text.match(/https?:\/\/[^\s<>"]+/g) ?? [];
	const url = urls.find((u) => path.test(new URL(u).pathname));
	if (!url) throw new Error(`no link matching ${path} in "${mail.subject}"`);
	return url;
}
