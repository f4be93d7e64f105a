import type { RouteObject } from 'react-router-dom';
import { RESERVOIR_SCREENS } from '../../../config/paths';
import { RequirePermission } from '../components/require-permission';

/**
 * Wraps each reservoir screen's route in the guard its RESERVOIR_SCREENS entry names, so a typed
 * URL meets the same rule as the hidden link. A route is matched to its screen by the href the
 * screen builds; routes without an entry or an action are left as they are.
 */
export function guardScreens(children: RouteObject[]): RouteObject[] {
  const probe = '_';
  return children.map((route) => {
    const screen = RESERVOIR_SCREENS.find((s) =>
      s.getHref(probe).endsWith(`/${probe}/${route.path}`),
    );
    if (!screen?.action || route.index) return route;
    return {
      ...route,
      element: <RequirePermission action={screen.action}>{route.element}</RequirePermission>,
    };
  });
}
