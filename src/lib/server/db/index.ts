// The app's database handle, from DATABASE_URL.
import { serverEnv } from '$lib/server/env';
import { connect } from './connect';

export const { db } = connect(serverEnv().DATABASE_URL);
export type { Database } from './connect';
