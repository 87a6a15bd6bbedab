/** Query keys of the Safety review. */
export const safetyKeys = {
  all: ["safety"] as const,
  totals: () => [...safetyKeys.all, "locations"] as const,
  review: () => [...safetyKeys.all, "review"] as const,
  locations: () => [...safetyKeys.all, "location-admin"] as const,
  sdsDue: () => [...safetyKeys.all, "sds-due"] as const,
};
