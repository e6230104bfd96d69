import knex, { type Knex } from 'knex';
import { databaseConfig } from '../../../src/lib/server/db/config';

/** A Knex instance on the test database that `npm test` started (DB_* in the environment). */
export function testKnex(): Knex {
	if (!process.env.CHROMASLATE_TEST) {
		throw new Error('Integration tests run through `npm test`, which starts their own MariaDB.');
	}
	return knex(databaseConfig());
}
