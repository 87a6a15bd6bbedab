/**
 * The component tests' server: the real app on an ephemeral port, a temporary database built by
 * the migrations and filled with the demo facility, and the fixed clock of the API tests. Forms
 * under test talk to it through happy-dom's own fetch (cookies and all), as they would in a
 * browser; nothing of Phasebook is replaced by a stand-in.
 */
import type { TestProject } from "vitest/node";
import { seedDemo } from "../../server/db/seed/demo";
import { startTestApp, TEST_NOW } from "../support/test-app";

declare module "vitest" {
  export interface ProvidedContext {
    apiUrl: string;
  }
}

export default async function setup(project: TestProject) {
  const app = await startTestApp();
  await seedDemo(app.ds, { now: new Date(TEST_NOW), bcryptCost: 4 });
  project.provide("apiUrl", app.url);
  return async () => {
    await app.close();
  };
}
