/** Query keys for labels and scans; a scanned token is part of its key. */
export const labelKeys = {
  all: ["labels"] as const,
  scans: () => [...labelKeys.all, "scan"] as const,
  scan: (token: string) => [...labelKeys.scans(), token] as const,
  locations: () => [...labelKeys.all, "locations"] as const,
  stocks: () => [...labelKeys.all, "stocks"] as const,
};
