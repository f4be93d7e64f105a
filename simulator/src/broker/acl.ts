import { createHash, timingSafeEqual } from 'node:crypto';
import type { Client } from 'aedes';
import type { BrokerPolicy } from './broker.js';
import type { BrokerAccount } from './accounts.js';

/**
 * The topic rules, one table: what each kind of account may publish and subscribe to. `{r}` is
 * the account's reservoir, `{d}` its device id; `+` matches one level. The same rules for
 * Mosquitto are in docs/security.md.
 */
export const ACL_RULES = {
  device: {
    publish: [
      'stillwell/v1/{r}/telemetry/{d}',
      'stillwell/v1/{r}/ack/{d}',
      'stillwell/v1/{r}/rule-events/{d}',
      'stillwell/v1/{r}/backfill-reply/{d}',
    ],
    subscribe: [
      'stillwell/v1/{r}/command/{d}',
      'stillwell/v1/{r}/rules/{d}',
      'stillwell/v1/{r}/backfill/{d}',
    ],
  },
  clock: { publish: ['stillwell/v1/{r}/clock'], subscribe: [] },
  gateway: {
    publish: ['stillwell/v1/+/command/+', 'stillwell/v1/+/rules/+', 'stillwell/v1/+/backfill/+'],
    subscribe: [
      'stillwell/v1/+/telemetry/+',
      'stillwell/v1/+/ack/+',
      'stillwell/v1/+/clock',
      'stillwell/v1/+/rule-events/+',
      'stillwell/v1/+/backfill-reply/+',
    ],
  },
} as const satisfies Record<
  BrokerAccount['kind'],
  { publish: readonly string[]; subscribe: readonly string[] }
>;

function patternsOf(account: BrokerAccount, what: 'publish' | 'subscribe'): string[] {
  return ACL_RULES[account.kind][what].map((p) =>
    account.kind === 'gateway'
      ? p
      : p
          .replace('{r}', account.reservoirId)
          .replace('{d}', account.kind === 'device' ? account.deviceId : ''),
  );
}

/**
 * Does an allowed pattern cover every topic a filter can match? Level by level: `+` in the pattern
 * covers any one level (but not a `#`), a literal only itself; a `#` in the filter is never covered.
 */
export function covers(pattern: string, filter: string): boolean {
  const p = pattern.split('/');
  const f = filter.split('/');
  if (p.length !== f.length) return false;
  return p.every((level, i) => {
    const want = f[i]!;
    if (want === '#') return false;
    if (level === '+') return true;
    return level === want;
  });
}

export const mayPublish = (account: BrokerAccount, topic: string) =>
  !/[+#]/.test(topic) && patternsOf(account, 'publish').some((p) => covers(p, topic));
export const maySubscribe = (account: BrokerAccount, filter: string) =>
  patternsOf(account, 'subscribe').some((p) => covers(p, filter));

const digest = (s: string | Buffer) => createHash('sha256').update(s).digest();
/** Compares digests, so the time taken says nothing about how much of the password was right. */
const samePassword = (given: Buffer | undefined, expected: string) =>
  given !== undefined && timingSafeEqual(digest(given), digest(expected));

/**
 * aedes hooks enforcing the accounts and the topic rules. MQTT 3.1.1 has no way to refuse one
 * publish: aedes closes the client's connection without a word, so every refusal is logged here.
 * A refused subscription is answered with the failure code and the connection stays.
 */
export function aclPolicy(
  accounts: readonly BrokerAccount[],
  log: (line: string) => void = () => {},
): BrokerPolicy {
  const byUsername = new Map(accounts.map((a) => [a.username, a]));
  const sessions = new WeakMap<Client, BrokerAccount>();
  const pinned = new Set(accounts.flatMap((a) => (a.kind === 'gateway' ? [] : [a.clientId])));
  return {
    authenticate: (client, username, password, done) => {
      const account = username === undefined ? undefined : byUsername.get(username);
      const ok = account !== undefined && samePassword(password, account.password);
      // devices are pinned to their client id, and nobody else may take one (a session takeover)
      const idOk =
        account?.kind === 'gateway' ? !pinned.has(client.id) : account?.clientId === client.id;
      if (!ok || !idOk) {
        log(
          `broker: refused connection of client "${client.id}" as "${username ?? '(anonymous)'}"${ok ? ': wrong client id' : ''}`,
        );
        const error = Object.assign(new Error('Bad username or password'), { returnCode: 4 });
        return done(error as Parameters<typeof done>[0], false);
      }
      sessions.set(client, account);
      done(null, true);
    },
    authorizePublish: (client, packet, done) => {
      const account = client ? sessions.get(client) : undefined;
      if (account && mayPublish(account, packet.topic)) return done(null);
      log(
        `broker: refused publish by "${account?.username ?? client?.id ?? '?'}" to ${packet.topic}; aedes closes its connection`,
      );
      done(new Error(`not allowed to publish to ${packet.topic}`));
    },
    authorizeSubscribe: (client, subscription, done) => {
      const account = client ? sessions.get(client) : undefined;
      if (account && maySubscribe(account, subscription.topic)) return done(null, subscription);
      log(
        `broker: refused subscription of "${account?.username ?? client?.id ?? '?'}" to ${subscription.topic}`,
      );
      done(null, null);
    },
  };
}
