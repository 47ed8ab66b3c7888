/** Moderation of one sitting; release pages read the same sitting's results, so they share a root. */
export const moderationKey = (sittingId: string) => ['moderation', sittingId] as const;
