/**
 * Every migration in order. A migration, once applied anywhere, is never edited: add a new
 * file named YYYYMMDDHHMMSS-kebab-description.ts and list it here.
 */
import type { QueryInterface } from 'sequelize';
import * as m20261201000000 from './20261201000000-create-foundation';

export interface Migration {
  name: string;
  up(qi: QueryInterface): Promise<void>;
  down(qi: QueryInterface): Promise<void>;
}

export const MIGRATIONS: Migration[] = [{ name: '20261201000000-create-foundation', ...m20261201000000 }];
