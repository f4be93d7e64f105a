/** Query keys of the notices feature, spelled once so mutations invalidate exactly what they change. */
export const noticesKeys = {
  all: ['notices'] as const,
  zones: (reservoirId: string) => ['notices', reservoirId, 'zones'] as const,
  contacts: (reservoirId: string) => ['notices', reservoirId, 'contacts'] as const,
  board: (reservoirId: string) => ['notices', reservoirId, 'board'] as const,
  outbox: () => ['notices', 'outbox'] as const,
  mine: () => ['notices', 'mine'] as const,
};

export const enc = encodeURIComponent;
