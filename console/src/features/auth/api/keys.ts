/** Query keys of one's own account; ['auth', 'me'] is the key other screens read `me` under too. */
export const authKeys = {
  me: () => ['auth', 'me'] as const,
  sessions: () => ['auth', 'sessions'] as const,
};
