/**
 * `npm run operator:create -- --email ops@example.com --name "Ops Person"`: creates a service
 * operator. The password is read from OPERATOR_PASSWORD or typed at the prompt (not echoed
 * to the shell history).
 */
import readline from 'node:readline/promises';
import { parseArgs } from 'node:util';
import { email as emailSchema, password as passwordSchema, personName } from '@domain/schemas/common';
import { hashPassword } from '../auth/passwords';
import { readEnv } from '../config/env';
import { openDatabase } from '../index';
import { AuditEvent } from '../models/AuditEvent';
import { User } from '../models/User';

async function main(): Promise<void> {
  const { values } = parseArgs({ options: { email: { type: 'string' }, name: { type: 'string' } } });
  const email = emailSchema.parse(values.email);
  const name = personName.parse(values.name ?? 'Mullion Operator');
  let password = process.env.OPERATOR_PASSWORD;
  if (!password) {
    const rl = readline.createInterface({ input: process.stdin, output: process.stdout });
    password = await rl.question('Password for the operator (at least 10 characters): ');
    rl.close();
  }
  passwordSchema.parse(password);
  const sequelize = await openDatabase(readEnv());
  try {
    if ((await User.count({ where: { email }, crossTenant: true })) > 0) throw new Error(`${email} already has a sign-in.`);
    const user = await User.create({ tenantId: null, email, name, role: 'operator', passwordHash: await hashPassword(password) });
    await AuditEvent.create({ tenantId: null, actorId: null, actorRole: null, action: 'operator.created', subjectType: 'User', subjectId: user.id, details: { email }, ip: null });
    console.log(`Operator ${email} created.`);
  } finally {
    await sequelize.close();
  }
}

main().catch((err: unknown) => {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
});
