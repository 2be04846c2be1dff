// How a job's number reads on screen and in mail (its stages read as $lib/stages says).
export const jobRef = (n: number) => `J-${n}`;
