import { IsNull, type EntityManager } from 'typeorm';
import { SessionRow } from './session.entity';

/** Ends every live session of a user inside the caller's transaction; returns their ids. */
export async function endSessionsOf(
  tx: EntityManager,
  userId: string,
  reason: string,
  options: { except?: string; now?: number } = {},
): Promise<string[]> {
  const now = options.now ?? Date.now();
  const live = await tx.find(SessionRow, {
    where: { userId, revokedAt: IsNull() },
    select: { id: true },
  });
  const ids = live.map((s) => s.id).filter((id) => id !== options.except);
  for (const id of ids)
    await tx.update(SessionRow, { id }, { revokedAt: now, revokedReason: reason });
  return ids;
}
