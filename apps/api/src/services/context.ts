import type { Db } from '../db/client';
import type { Mailer } from '../mail/mailer';
import type { AppLucia } from './lucia';

/** What services need from the outside world; passed in, so tests can swap any part. */
export interface ServiceContext {
  db: Db;
  lucia: AppLucia;
  mailer: Mailer;
  appUrl: string;
  now: () => Date;
}
