/** Small line icons for the navigation; always next to their words, never alone. */
import type { ReactElement } from "react";

export type NavIconName =
  | "home"
  | "schedule"
  | "bookings"
  | "instruments"
  | "training"
  | "stockroom"
  | "scan"
  | "recharge"
  | "safety"
  | "people"
  | "mailbox";

const PATHS: Record<NavIconName, ReactElement> = {
  home: <path d="M3 8.5 10 3l7 5.5V17H3Z M8 17v-5h4v5" />,
  schedule: <path d="M3.5 5h13v11.5h-13Z M3.5 8.5h13 M7 3v4 M13 3v4 M6.5 11.5h2 M11.5 11.5h2 M6.5 14h2" />,
  bookings: <path d="M4 4h12v13H4Z M7 8l1.3 1.3L10.5 7 M7 12.5l1.3 1.3 2.2-2.3 M12.5 8.5h1.5 M12.5 13h1.5" />,
  instruments: <path d="M3 5h14v10H3Z M5.5 15v2 M14.5 15v2 M11 7.5h4 M11 10h4 M11 12.5h2.5 M5 10a2.5 2.5 0 1 0 5 0a2.5 2.5 0 1 0-5 0 M7.5 10l1.2-1.2" />,
  training: <path d="M10 3 17 6.5 10 10 3 6.5Z M6 8.3v4.2c2.5 2 5.5 2 8 0V8.3 M17 6.5v5" />,
  stockroom: <path d="M8 3h4 M8.5 3v4L5 15.5A1.2 1.2 0 0 0 6.1 17h7.8a1.2 1.2 0 0 0 1.1-1.5L11.5 7V3 M6.5 12.5c2.3-.9 4.7-.9 7 0" />,
  scan: <path d="M3 7V3h4 M13 3h4v4 M17 13v4h-4 M7 17H3v-4 M6.5 6.5h3v3h-3Z M10.5 10.5h3v3h-3Z M12 6.5h1.5v1.5 M6.5 12h1.5v1.5" />,
  recharge: <path d="M5 2.8h10v14.4l-2-1.2-1.5 1.2-1.5-1.2-1.5 1.2L7 16l-2 1.2Z M7.5 6.5h5 M7.5 9.5h5 M7.5 12.5h3" />,
  safety: <path d="M10 2.8 16 5v5c0 3.6-2.6 6.1-6 7.2-3.4-1.1-6-3.6-6-7.2V5Z M10 6.5v4.5 M10 13v.5" />,
  people: <path d="M4.5 7a2.5 2.5 0 1 0 5 0a2.5 2.5 0 1 0-5 0 M2.5 16c0-2.8 2-4.5 4.5-4.5S11.5 13.2 11.5 16 M12 5.2a2.3 2.3 0 1 1 1.6 4 M13.5 11.5c2.3.2 4 1.8 4 4.5" />,
  mailbox: <path d="M3 5h14v10H3Z M3 5.5l7 5 7-5" />,
};

export function NavIcon({ name }: { name: NavIconName }) {
  return (
    <svg
      viewBox="0 0 20 20"
      className="size-4 shrink-0"
      fill="none"
      stroke="currentColor"
      strokeWidth="1.5"
      strokeLinecap="round"
      strokeLinejoin="round"
      aria-hidden="true"
      focusable="false"
    >
      {PATHS[name]}
    </svg>
  );
}
