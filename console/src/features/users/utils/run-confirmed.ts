/**
 * Runs an act the gateway guards with a step-up, asking for the password first where needed;
 * null when the person cancels. The app hands it in from the sign-in feature.
 */
export type RunConfirmed = <T>(purpose: string, run: () => Promise<T>) => Promise<T | null>;
