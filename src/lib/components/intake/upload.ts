// One photo to the upload API with XMLHttpRequest, whose upload events report progress
// (fetch cannot). Resolves with the draft the server stored, or rejects with its message.
export interface UploadedDraft {
	token: string;
	name: string;
	width: number;
	height: number;
}

export interface Upload {
	done: Promise<UploadedDraft>;
	abort(): void;
}

export function uploadPhoto(file: File, onProgress: (fraction: number) => void): Upload {
	const xhr = new XMLHttpRequest();
	const done = new Promise<UploadedDraft>((resolve, reject) => {
		xhr.upload.addEventListener('progress', (e) => {
			if (e.lengthComputable && e.total > 0) onProgress(Math.min(0.99, e.loaded / e.total));
		});
		xhr.addEventListener('load', () => {
			let body: { message?: string } & Partial<UploadedDraft> = {};
			try {
				body = JSON.parse(xhr.responseText);
			} catch {
				// not JSON: a proxy or the body limit answered
			}
			if (xhr.status === 201 && body.token) resolve(body as UploadedDraft);
			else if (xhr.status === 413) reject(new Error(body.message ?? 'This photo is too large.'));
			else {
				reject(
					new Error(body.message ?? `The upload failed (${xhr.status}). Remove it and try again.`)
				);
			}
		});
		xhr.addEventListener('error', () =>
			reject(new Error('The upload was cut off. Check the connection, remove it and try again.'))
		);
		xhr.addEventListener('abort', () => reject(new Error('Upload stopped.')));
	});
	const form = new FormData();
	form.append('file', file, file.name);
	xhr.open('POST', '/api/uploads');
	xhr.setRequestHeader('accept', 'application/json');
	xhr.send(form);
	return { done, abort: () => xhr.abort() };
}
