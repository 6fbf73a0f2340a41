// The app's database handle, from DATABASE_URL. The driver connects on the first query, so the build never connects.
import { building } from '$app/environment';
import { serverEnv } from '$lib/server/env';
import { connect } from './connect';

export const { db, client } = connect(building ? 'postgres://build@127.0.0.1:1/none' : serverEnv().DATABASE_URL, 10, { timeouts: true });
export type { Database } from './connect';
