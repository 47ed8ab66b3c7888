/** Every sittings query starts with this key, so one invalidation refreshes lists and details. */
export const sittingsKey = ['sittings'] as const;
export const sittingKey = (id: string) => [...sittingsKey, 'detail', id] as const;
