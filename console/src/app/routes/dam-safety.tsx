import { useParams } from 'react-router-dom';
import { useCan } from '../../features/auth/hooks/use-can';
import { useStepUp } from '../../features/auth/hooks/use-step-up';
import { DamSafetyScreen } from '../../features/instruments/components/dam-safety-screen';
import { useReservoir } from '../../features/reservoirs/api/get-reservoir';

/**
 * Seepage weirs and foundation piezometers against the pool, and their limits; who may change
 * the limits and the identity check come from the sign-in feature.
 */
export function DamSafetyRoute() {
  const { reservoirId = '' } = useParams();
  const reservoir = useReservoir(reservoirId);
  const canEditLimits = useCan('limits.edit');
  const { withStepUp, dialog } = useStepUp();
  const data = reservoir.data;
  if (!data) return null;
  return (
    <>
      <DamSafetyScreen
        definition={data.definition}
        version={data.version}
        canEditLimits={canEditLimits}
        withStepUp={withStepUp}
        reloadDefinition={async () => (await reservoir.refetch()).data?.version}
      />
      {dialog}
    </>
  );
}
