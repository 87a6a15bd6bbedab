/**
 * The Safety review while its two answers arrive, against the real server of global-setup.ts: the
 * lists below never show before the totals above them, whichever answer comes first, so the totals
 * arriving never push the lists down the page (a Lighthouse run had measured a layout shift of 0.63
 * when they did). Every change of the page is checked as it happens, not only the end state.
 */
import { afterEach, beforeAll, describe, expect, it } from "vitest";
import { cleanup, screen } from "@testing-library/react";
import { SafetyRoute } from "@/app/routes/safety";
import { getLocationTotals, locationTotalsQueryOptions } from "@/features/safety/api/get-location-totals";
import { getReview, reviewQueryOptions } from "@/features/safety/api/get-review";
import { createQueryClient } from "@/lib/query-client";
import { renderScreen, signInAs } from "./support";

const LIST = "Carcinogens and acutely toxic substances";
const TOTALS = /Flammable and combustible liquid per location/;

/** Renders the page and records every moment the lists were on the page without the totals table. */
async function watchArrival(seed: (qc: ReturnType<typeof createQueryClient>) => Promise<void>) {
  const qc = createQueryClient();
  await seed(qc);
  const seen: string[] = [];
  const observer = new MutationObserver(() => {
    const lists = [...document.querySelectorAll("h2, h3")].some((h) => h.textContent?.startsWith(LIST));
    const totals = [...document.querySelectorAll("caption")].some((c) => TOTALS.test(c.textContent ?? ""));
    seen.push(lists ? (totals ? "both" : "lists without totals") : totals ? "totals" : "neither");
  });
  observer.observe(document.body, { childList: true, subtree: true, characterData: true });
  renderScreen(<SafetyRoute />, qc);
  await screen.findByText(new RegExp(`^${LIST}`), undefined, { timeout: 10_000 });
  observer.disconnect();
  return seen;
}

describe("the Safety review while its answers arrive", () => {
  beforeAll(async () => {
    await signInAs("safety@kestrelbay.example");
  });
  afterEach(cleanup);

  it("draws the lists with the totals or after them when the review's answer is there first", async () => {
    const seen = await watchArrival(async (qc) => {
      qc.setQueryData(reviewQueryOptions().queryKey, await getReview());
    });
    expect(seen).not.toContain("lists without totals");
    expect(seen).toContain("both");
  });

  it("draws the lists after the totals when the totals' answer is there first", async () => {
    const seen = await watchArrival(async (qc) => {
      qc.setQueryData(locationTotalsQueryOptions().queryKey, await getLocationTotals());
    });
    expect(seen).not.toContain("lists without totals");
    expect(seen[0]).not.toBe("neither");
  });

  it("draws the lists with the totals or after them when both answers come over the network", async () => {
    const seen = await watchArrival(async () => undefined);
    expect(seen).not.toContain("lists without totals");
    expect(seen).toContain("both");
  });
});
