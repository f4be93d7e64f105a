import { ACL_RULES } from './acl.js';
import { CLOCK_USERNAME } from './accounts.js';

/**
 * The same topic rules as an acl_file for Mosquitto (or any broker that reads that format), for
 * one reservoir. Devices log in with their device id as the username, so one `pattern` per rule
 * (%u = the username) covers them all.
 */
export function mosquittoAcl(reservoirId: string, gatewayUsername = 'stillwell-gateway'): string {
  const lines = (
    rules: readonly string[],
    access: 'read' | 'write',
    prefix: string,
    sub: (p: string) => string,
  ) => rules.map((p) => `${prefix} ${access} ${sub(p)}`);
  const here = (p: string) => p.replace('{r}', reservoirId);
  return [
    '# the gateway',
    `user ${gatewayUsername}`,
    ...lines(ACL_RULES.gateway.subscribe, 'read', 'topic', here),
    ...lines(ACL_RULES.gateway.publish, 'write', 'topic', here),
    '',
    "# the simulator's plant clock",
    `user ${CLOCK_USERNAME}`,
    ...lines(ACL_RULES.clock.publish, 'write', 'topic', here),
    '',
    '# every field device: its username is its device id',
    ...lines(ACL_RULES.device.publish, 'write', 'pattern', (p) => here(p).replace('{d}', '%u')),
    ...lines(ACL_RULES.device.subscribe, 'read', 'pattern', (p) => here(p).replace('{d}', '%u')),
  ].join('\n');
}
