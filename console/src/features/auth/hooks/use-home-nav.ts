import type { ShellNavItem } from '../../../components/layouts/console-shell';
import { paths } from '../../../config/paths';
import { useCan } from './use-can';

/** The way back from a page outside the reservoirs: the control room, or a stakeholder's releases. */
export function useHomeNav(): ShellNavItem[] {
  const controlRoom = useCan('reservoir.read');
  const releases = useCan('notices.acknowledge');
  return !controlRoom && releases
    ? [{ label: 'My releases', to: paths.myReleases.getHref() }]
    : [{ label: 'Control room', to: paths.home.getHref() }];
}
