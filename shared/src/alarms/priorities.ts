import { z } from 'zod';

/**
 * Alarm priorities, named for the response they ask of the operator rather than numbered, so that
 * nobody has to remember which end of a scale is the urgent one. Most alarms should be the lowest.
 */
export const PRIORITIES = ['immediate', 'prompt', 'advisory'] as const;
export const prioritySchema = z.enum(PRIORITIES);
export type Priority = z.infer<typeof prioritySchema>;

export const PRIORITY_INFO: Readonly<Record<Priority, { label: string; response: string }>> = {
  immediate: { label: 'Immediate', response: 'act now: the dam or people downstream are at stake' },
  prompt: { label: 'Prompt', response: 'act within about 15 minutes' },
  advisory: { label: 'Advisory', response: 'look into it within the shift' },
};

/** 0 is the most urgent: sorts lists and picks the worst of a set. */
export function priorityRank(p: Priority): number {
  return PRIORITIES.indexOf(p);
}
