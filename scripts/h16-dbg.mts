import { streamBody, rawRequest } from '../tests/support/raw-http';
const url = 'http://127.0.0.1:56174';
const r = await rawRequest(url, '/office/team/');
console.log(r.status, r.headers.location);
const b = '----x';
const t0 = Date.now();
const res = await streamBody(url, '/api/uploads', { bytes: 40 * 1024 * 1024, prefix: Buffer.from(`--${b}\r\nContent-Disposition: form-data; name="file"; filename="big.jpg"\r\nContent-Type: image/jpeg\r\n\r\n`), suffix: Buffer.from(`\r\n--${b}--\r\n`), headers: { 'content-type': `multipart/form-data; boundary=${b}`, accept: 'application/json' } }).catch((e) => e);
console.log(Date.now() - t0, res.status ?? res, res.body, res.sentBytes);
