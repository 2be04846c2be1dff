/**
 * A task as a crew does it: so many people for so many hours. Crew-hours (what is paid) are
 * people × hours; the hours come from a quantity and a production rate in person-hours.
 */
export interface CrewTask {
	task: string;
	people: number;
	/** Hours on the clock with that many people. */
	hours: number;
}

export const crewHours = (t: CrewTask) => t.people * t.hours;

/** A task of `personHours` of work shared by `people` (at least one). */
export function crewTask(task: string, personHours: number, people: number): CrewTask {
	const n = Math.max(1, Math.round(people));
	return { task, people: n, hours: Math.max(0, personHours) / n };
}

/** Only the tasks that take any time. */
export const withWork = (tasks: readonly CrewTask[]) => tasks.filter((t) => t.hours > 0);
