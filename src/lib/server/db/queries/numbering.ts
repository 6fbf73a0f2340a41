// Objects numbered per parent (corner revisions, car revisions): the next number is taken inside the insert, and
// two saves at once both succeed — the loser of the unique-number race retries and takes the next number.

const UNIQUE_VIOLATION = '23505';

/** True when e is a unique violation of the named constraint (also when the driver's error is wrapped as `cause`). */
function violates(e: unknown, constraint: string) {
	const cause = (e as { cause?: { code?: string; constraint_name?: string } }).cause ?? (e as { code?: string; constraint_name?: string });
	return cause?.code === UNIQUE_VIOLATION && cause.constraint_name === constraint;
}

/** Runs save (a transaction that inserts the next number) again while it loses the race on `constraint`, at most 20 times. */
export async function retryingNumberRace<T>(constraint: string, save: () => Promise<T>): Promise<T> {
	for (let attempt = 0; ; attempt++) {
		try {
			return await save();
		} catch (e) {
			if (!violates(e, constraint) || attempt >= 20) throw e;
		}
	}
}
