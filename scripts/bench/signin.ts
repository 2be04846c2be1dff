// `npm run bench:signin` (not a test): the hashing work of a sign-in with an unknown e-mail against
// one with a known e-mail and a wrong password. attemptSignIn (src/lib/server/auth/signin.ts) runs
// verifyPassword on the member's hash for a known e-mail and verifyAgainstDummy for an unknown one;
// both are one argon2id verification, so the ratio should be close to 1. Without the dummy
// verification an unknown e-mail would answer after the database lookup alone, many times faster.
// The database lookup and throttle queries are the same on both paths and are left out here.
// BENCH_ITERATIONS (default 20) sets the number of timed runs of each.
import {
	hashPassword,
	verifyAgainstDummy,
	verifyPassword
} from '../../src/lib/server/auth/passwords';
import { medianMs, writeResult } from './lib';

const iterations = Number(process.env.BENCH_ITERATIONS ?? 20);
const memberHash = await hashPassword('a member password for the benchmark');

const knownMs = await medianMs(() => verifyPassword(memberHash, 'a wrong password'), iterations, 3);
const unknownMs = await medianMs(() => verifyAgainstDummy('a wrong password'), iterations, 3);
const ratio = unknownMs / knownMs;

console.log(`known e-mail, wrong password: median ${knownMs.toFixed(1)} ms (argon2id verify)`);
console.log(`unknown e-mail: median ${unknownMs.toFixed(1)} ms (verify against the dummy hash)`);
console.log(`ratio unknown / known: ${ratio.toFixed(2)} (1.00 means the same work)`);
writeResult('signin', { iterations, knownMedianMs: knownMs, unknownMedianMs: unknownMs, ratio });
