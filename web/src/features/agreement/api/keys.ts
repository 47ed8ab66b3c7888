/** Every agreement query starts with this key. */
export const agreementKey = ['agreement'] as const;
