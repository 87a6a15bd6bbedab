/** Every component test: unmount what the test rendered, and make happy-dom's page live at the test server's address (relative /api requests go there). */
import { afterEach, inject } from "vitest";
import { cleanup } from "@testing-library/react";

(window as unknown as { happyDOM: { setURL(url: string): void } }).happyDOM.setURL(`${inject("apiUrl")}/`);

afterEach(() => {
  cleanup();
});
