import type { ReactNode } from 'react';
import { useParams } from 'react-router-dom';
import type { ReservoirDefinition } from '@stillwell/shared/reservoirs';
import { MyReleasesScreen } from '../../features/notices/components/my-releases-screen';
import { ConsoleShell } from '../../components/layouts/console-shell';
import { paths } from '../../config/paths';
import { NoticesScreen } from '../../features/notices/components/notices-screen';
import { OutboxScreen } from '../../features/notices/components/outbox-screen';
import { RegistryScreen } from '../../features/notices/components/registry-screen';
import { useReservoir } from '../../features/reservoirs/api/get-reservoir';

/** The layout has loaded the definition before these render; it is read from the cache. */
function withDefinition(Screen: (props: { definition: ReservoirDefinition }) => ReactNode) {
  return function NoticesFeatureRoute() {
    const { reservoirId = '' } = useParams();
    const definition = useReservoir(reservoirId).data?.definition;
    return definition ? <Screen definition={definition} /> : null;
  };
}

export const NoticesRoute = withDefinition(NoticesScreen);
export const DownstreamRoute = withDefinition(RegistryScreen);
export const OutboxRoute = OutboxScreen;

/** A stakeholder's releases, in a shell of their own: they have no reservoir screens to move between. */
export function MyReleasesRoute() {
  return (
    <ConsoleShell
      reservoirName="Releases downstream"
      nav={[{ label: 'My releases', to: paths.myReleases.getHref() }]}
    >
      <title>My releases · Stillwell</title>
      <MyReleasesScreen />
    </ConsoleShell>
  );
}
