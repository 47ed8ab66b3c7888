/** Every standardisation query starts with this key. */
export const standardisationKey = ['standardisation'] as const;
export const exerciseKey = (id: string) => [...standardisationKey, 'exercise', id] as const;
