/** Query keys for the session: one factory, so invalidation after sign-in or sign-out hits exactly these. */
export const authKeys = {
  all: ["auth"] as const,
  me: () => [...authKeys.all, "me"] as const,
};
