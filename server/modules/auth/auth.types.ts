import type { Db } from '../../db/client.ts';
import type { Env } from '../../env.ts';
import type { Logger } from '../../logger.ts';
import type { Mailer } from '../mail/mailer.ts';

/** A transaction handle, accepted wherever a query may run inside one. */
export type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];
/** The database or a transaction. */
export type Executor = Db | Tx;

/** What the account modules need: configuration, the database, a logger and the mailer. */
export interface AccountsDeps {
  env: Env;
  db: Db;
  logger: Logger;
  mailer: Mailer;
}
