// The app's database handle, from DATABASE_URL. The driver connects on the first query, so the build never connects.
import { building } from '$app/environment';
import { serverEnv } from '$lib/server/env';
import { onShutdown } from '$lib/server/lifecycle';
import { connect } from './connect';

export const { db, client } = connect(building ? 'postgres://build@127.0.0.1:1/none' : serverEnv().DATABASE_URL, 10, { timeouts: true });
export type { Database } from './connect';

// At shutdown, after the last request: queries still running get a second, then the connections close.
onShutdown('database pool', () => client.end({ timeout: 1 }));
