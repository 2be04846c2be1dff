// Outgoing e-mail through nodemailer over SMTP (the maildev stand-in locally).
import nodemailer, { type SendMailOptions, type Transporter } from 'nodemailer';
import { env } from './env';

let transport: Transporter | null = null;

function transporter(): Transporter {
	transport ??= nodemailer.createTransport({
		host: env.SMTP_HOST ?? '127.0.0.1',
		port: Number(env.SMTP_PORT ?? 1025),
		secure: env.SMTP_SECURE === 'true',
		auth: env.SMTP_USER ? { user: env.SMTP_USER, pass: env.SMTP_PASS ?? '' } : undefined,
		connectionTimeout: 5000,
		greetingTimeout: 5000,
		// A server that stops answering mid-message must not hold the outbox row (locked while
		// it is sent) for nodemailer's default ten minutes: give up after 30 s and retry later.
		socketTimeout: Number(env.SMTP_SOCKET_TIMEOUT_MS ?? 30_000)
	});
	return transport;
}

export interface Message {
	to: string;
	subject: string;
	text: string;
	html: string;
	attachments?: SendMailOptions['attachments'];
	messageId?: string;
}

export async function sendMail(message: Message): Promise<void> {
	await transporter().sendMail({
		from: env.MAIL_FROM ?? 'Rillstone <office@rillstone.invalid>',
		...message
	});
}

const escapeMap: Record<string, string> = {
	'&': '&amp;',
	'<': '&lt;',
	'>': '&gt;',
	'"': '&quot;',
	"'": '&#39;'
};
export function escapeHtml(value: string): string {
	return value.replace(/[&<>"']/g, (c) => escapeMap[c]);
}

/** A plain, self-contained HTML body (no remote images) with the firm's sign-off. */
export function htmlBody(
	paragraphs: string[],
	action?: { label: string; url: string },
	footer = ''
): string {
	const body = paragraphs.map((p) => `<p style="margin:0 0 14px">${escapeHtml(p)}</p>`).join('');
	const button = action
		? `<p style="margin:20px 0"><a href="${escapeHtml(action.url)}" style="background:#1b5356;color:#fff;padding:10px 18px;border-radius:8px;text-decoration:none;font-weight:600">${escapeHtml(action.label)}</a></p><p style="font-size:13px;color:#3f4a45">Or paste this address into your browser: ${escapeHtml(action.url)}</p>`
		: '';
	return `<!doctype html><html><body style="font-family:Georgia,serif;color:#1d2421;background:#fbf8f2;padding:24px"><div style="max-width:560px;margin:auto">${body}${button}<p style="font-size:13px;color:#3f4a45;margin-top:28px">${escapeHtml(footer)}</p></div></body></html>`;
}
