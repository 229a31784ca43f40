/**
 * Every migration in order. A migration, once applied anywhere, is never edited: add a new
 * file named YYYYMMDDHHMMSS-kebab-description.ts and list it here.
 */
import type { QueryInterface } from 'sequelize';
import * as m20261201000000 from './20261201000000-create-foundation';
import * as m20261201010000 from './20261201010000-create-installed-base';
import * as m20261201020000 from './20261201020000-create-premises';
import * as m20261201030000 from './20261201030000-create-jobs';
import * as m20261201040000 from './20261201040000-client-invitations';
import * as m20261202000000 from './20261202000000-firm-phone';
import * as m20261202010000 from './20261202010000-billing';
import * as m20261202020000 from './20261202020000-pending-checkout';
import * as m20261205000000 from './20261205000000-life-safety-rules';
import * as m20261205100000 from './20261205100000-mail-outbox';
import * as m20261205200000 from './20261205200000-signup-requests';

export interface Migration {
  name: string;
  up(qi: QueryInterface): Promise<void>;
  down(qi: QueryInterface): Promise<void>;
}

export const MIGRATIONS: Migration[] = [
  { name: '20261201000000-create-foundation', ...m20261201000000 },
  { name: '20261201010000-create-installed-base', ...m20261201010000 },
  { name: '20261201020000-create-premises', ...m20261201020000 },
  { name: '20261201030000-create-jobs', ...m20261201030000 },
  { name: '20261201040000-client-invitations', ...m20261201040000 },
  { name: '20261202000000-firm-phone', ...m20261202000000 },
  { name: '20261202010000-billing', ...m20261202010000 },
  { name: '20261202020000-pending-checkout', ...m20261202020000 },
  { name: '20261205000000-life-safety-rules', ...m20261205000000 },
  { name: '20261205100000-mail-outbox', ...m20261205100000 },
  { name: '20261205200000-signup-requests', ...m20261205200000 },
];
