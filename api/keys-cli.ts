/**
 * `npm run keys -- <command>`: manages API keys in the Redis the service uses (REDIS_URL).
 *   create --tenant <name> --role read|design|admin [--label <text>]   prints the new key once
 *   list --tenant <name>                                                 keys without secrets
 *   revoke --tenant <name> --id <key id>
 * The embedded backend keeps its keys in memory: use its printed key and /v1/admin/keys instead.
 */
import { parseArgs } from 'node:util';
import { ROLES, TENANT_PATTERN, type Role } from './auth/api-key.js';
import { createKey, keyView } from './auth/create-key.js';
import { createRedisKeyStore } from './auth/redis-key-store.js';

function fail(message: string): never {
  process.stderr.write(`keys: ${message}\n`);
  process.exit(2);
}

const { positionals, values } = parseArgs({
  allowPositionals: true,
  options: {
    tenant: { type: 'string' },
    role: { type: 'string' },
    label: { type: 'string' },
    id: { type: 'string' },
  },
});
const command = positionals[0];
const redisUrl = process.env['REDIS_URL'];
if (redisUrl === undefined || !/^rediss?:\/\/\S+$/.test(redisUrl)) {
  fail('REDIS_URL must name the Redis the service uses (for example redis://localhost:6379)');
}
const tenant = values.tenant;
if (tenant === undefined || !TENANT_PATTERN.test(tenant)) {
  fail('--tenant must be 1 to 64 letters, digits, - or _');
}

const keys = createRedisKeyStore({ redisUrl, commandTimeoutMs: 5000 });
try {
  switch (command) {
    case 'create': {
      const role = values.role as Role | undefined;
      if (role === undefined || !ROLES.includes(role)) fail(`--role must be ${ROLES.join(', ')}`);
      const label = values.label ?? `made with npm run keys on ${new Date().toISOString()}`;
      const { record, token } = await createKey(keys, { tenant, role, label });
      process.stdout.write(`${JSON.stringify({ ...keyView(record), key: token })}\n`);
      process.stderr.write('keys: the key is shown only now; the service keeps its hash.\n');
      break;
    }
    case 'list':
      for (const record of await keys.list(tenant)) {
        process.stdout.write(`${JSON.stringify(keyView(record))}\n`);
      }
      break;
    case 'revoke': {
      if (values.id === undefined) fail('revoke needs --id <key id>');
      if (!(await keys.revoke(tenant, values.id, new Date().toISOString()))) {
        fail(`tenant ${tenant} has no key ${values.id}`);
      }
      process.stdout.write(`revoked ${values.id}\n`);
      break;
    }
    default:
      fail('command must be create, list or revoke');
  }
} finally {
  await keys.close();
}
