/** Every classes query starts with this key, so an import or a member change refreshes them all. */
export const classesKey = ['classes'] as const;
export const studentsKey = ['students'] as const;
