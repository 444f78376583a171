import { parseArgs } from 'node:util';
import { loadConfig } from '../config.js';
import { userCreateSchema } from '../../shared/schemas/auth.js';
import { ROLES } from '../../shared/schemas/roles.js';

// npm run user:create -- --email a@b.c --name "A B" --roles manager,tester [--password …] [--all-sites]
// Makes a real (non-demo) account. Without --password, a random one is generated and printed once.

const usage = `usage: npm run user:create -- --email EMAIL --name NAME --roles ROLE[,ROLE…] [--password PW] [--all-sites]
roles: ${ROLES.join(', ')}`;

async function main(): Promise<number> {
  const { values } = parseArgs({
    options: {
      email: { type: 'string' },
      name: { type: 'string' },
      roles: { type: 'string' },
      password: { type: 'string' },
      'all-sites': { type: 'boolean', default: false },
      help: { type: 'boolean', default: false },
    },
  });
  if (values.help) {
    console.log(usage);
    return 0;
  }
  const { newOneTimePassword } = await import('../features/users/users.service.js');
  const generated = values.password ? null : newOneTimePassword();
  const parsed = userCreateSchema.safeParse({
    email: values.email,
    name: values.name,
    roles: (values.roles ?? '').split(',').map((r) => r.trim()).filter(Boolean),
    password: values.password ?? generated,
    allSites: values['all-sites'],
    siteIds: [],
  });
  if (!parsed.success) {
    for (const i of parsed.error.issues) console.error(`${i.path.join('.') || 'input'}: ${i.message}`);
    console.error(usage);
    return 2;
  }
  // The password policy (at least 12 characters, at most 72 bytes, not a common or guessable password).
  const { passwordPolicyProblem } = await import('../../shared/auth/password-policy.js');
  const problem = passwordPolicyProblem(parsed.data.password, [parsed.data.email, parsed.data.name]);
  if (problem) {
    console.error(`password: ${problem}`);
    return 2;
  }
  const config = loadConfig();
  if (!config.dbPassword) {
    console.error(`No database password found in ${config.dataDir}: run npm start (or npm run db:start) first.`);
    return 1;
  }
  const { default: db } = await import('../db/data-source.js');
  await db.initialize();
  try {
    const { createUser } = await import('../features/users/users.service.js');
    const { systemClock } = await import('../common/clock.js');
    const user = await db.transaction((m) => createUser(m, systemClock, null, parsed.data));
    console.log(`Created user ${user.id}: ${user.email} (${user.roles.join(', ')})`);
    if (generated) console.log(`Password (shown once): ${generated}`);
    return 0;
  } catch (err) {
    console.error(err instanceof Error ? err.message : String(err));
    return 1;
  } finally {
    await db.destroy();
  }
}

main().then((code) => process.exit(code));
