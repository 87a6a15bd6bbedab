/**
 * The page boot (server/http/page-boot.ts): its table of screens follows the client's route table,
 * and the page it writes carries the session block and the first screen's preloads, read from a
 * build manifest (a small one written here, shaped as Vite writes it).
 */
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { createPageBoot, WARM_UP, PAGE_MODULES } from "../../server/http/page-boot";
import { paths } from "../../src/config/paths";
import { SCREEN_HEADS } from "../../shared/screens";
import { searchText, SEARCH_MAX } from "../../shared/schemas/common";

const facility = { name: "Liquid Interfaces Core", timeZone: "America/Halifax", currency: "CAD", publicDemo: false };
const member: Express.User = { id: 7, email: "member@example.org", name: "A. Member", roles: ["member"], groupId: 2, leadOf: [], organisation: null };

describe("the page boot's table of screens", () => {
  const router = fs.readFileSync("src/app/router.tsx", "utf8");
  const routed = new Set([...router.matchAll(/import\("\.\/(routes\/[\w/-]+)"\)/g)].map((m) => `src/app/${m[1]}`));
  const listed = new Set(PAGE_MODULES.map((p) => p.screen.replace(/\.tsx$/, "")));

  it("names every screen module the client's routes load, and only those", () => {
    routed.delete("src/app/routes/signed-in-frame");
    expect([...listed].sort()).toEqual([...routed].sort());
    for (const { screen } of PAGE_MODULES) expect(fs.existsSync(screen), screen).toBe(true);
  });

  it("gives each address the area whose roles guard its route, and no area to the others", () => {
    // "admin.people" → paths.admin.people.path
    const pathOf = (ref: string) => (ref.split(".").reduce<unknown>((o, k) => (o as Record<string, unknown>)[k], paths) as { path: string }).path;
    const guarded = new Map<string, string>();
    for (const block of router.matchAll(/restricted\(AREA_ROLES\.(\w+), \[([\s\S]*?)\]\),\n/g))
      for (const ref of block[2]!.matchAll(/\[paths\.([\w.]+)\.path,/g)) guarded.set(pathOf(ref[1]!), block[1]!);
    expect(guarded.size).toBeGreaterThan(8);
    for (const page of PAGE_MODULES) expect(page.area, page.path).toBe(guarded.get(page.path));
  });

  it("names for each head the screen that shows it: the screen's module uses those words", () => {
    const shown = (screen: string) => fs.readFileSync(screen, "utf8") + (screen.endsWith("recharge.tsx") ? fs.readFileSync("src/features/recharge/components/recharge-page.tsx", "utf8") : "");
    for (const page of PAGE_MODULES.filter((p) => p.head)) expect(shown(page.screen), page.path).toContain(`SCREEN_HEADS.${page.head}`);
    // Every head is written for some address.
    expect(new Set(PAGE_MODULES.map((p) => p.head).filter(Boolean))).toEqual(new Set(Object.keys(SCREEN_HEADS)));
  });

  it("has one entry per address the client's paths name", () => {
    const paths = fs.readFileSync("src/config/paths.ts", "utf8");
    const declared = [...paths.matchAll(/path: "([^"]+)"/g)].map((m) => m[1]!);
    expect(PAGE_MODULES.map((p) => p.path).sort()).toEqual([...new Set(declared)].sort());
  });
});

describe("the page a load gets", () => {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "phasebook-page-boot-"));
  afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));
  fs.mkdirSync(path.join(dir, ".vite"));
  fs.writeFileSync(
    path.join(dir, "index.html"),
    '<html><head><title>Phasebook</title><script type="module" src="/assets/index-A.js"></script></head><body><div id="root"><div role="status">Loading Phasebook…</div></div>\n<noscript>JavaScript, please.</noscript></body></html>',
  );
  fs.writeFileSync(
    path.join(dir, ".vite", "manifest.json"),
    JSON.stringify({
      "index.html": { file: "assets/index-A.js", isEntry: true, imports: ["_runtime-T.js", "_framework-F.js"] },
      "_runtime-T.js": { file: "assets/runtime-T.js" },
      "_framework-F.js": { file: "assets/framework-F.js", imports: ["_runtime-T.js"] },
      // The schemas: they need nothing but the bundler's runtime.
      "_data-D.js": { file: "assets/data-D.js", imports: ["_runtime-T.js"] },
      "_table-B.js": { file: "assets/table-B.js", imports: ["_runtime-T.js", "_framework-F.js"] },
      "src/app/routes/signed-in-frame.tsx": { file: "assets/signed-in-frame-S.js", imports: ["_framework-F.js"] },
      "src/app/routes/stockroom.tsx": { file: "assets/stockroom-R.js", imports: ["_data-D.js", "_framework-F.js", "_table-B.js"] },
      "src/app/routes/sign-in.tsx": { file: "assets/sign-in-I.js", imports: ["_framework-F.js"] },
    }),
  );
  const boot = createPageBoot(dir);
  const block = (html: string) => JSON.parse(/<script type="application\/json" id="phasebook-boot">(.*?)<\/script>/.exec(html)![1]!) as unknown;
  const preloads = (html: string) => [...html.matchAll(/rel="modulepreload" crossorigin href="\/([^"]+)"/g)].map((m) => m[1]);
  const runEarly = (html: string) => [...html.matchAll(/<script type="module" async crossorigin src="\/([^"]+)"><\/script>/g)].map((m) => m[1]);

  it("preloads the signed-in person's screen, what it imports and the frame, not what the entry loads already", () => {
    const html = boot.html("/stockroom", { user: member, facility });
    expect(preloads(html)).toEqual(["assets/signed-in-frame-S.js", "assets/stockroom-R.js", "assets/data-D.js", "assets/table-B.js"]);
    expect(block(html)).toEqual({ facility, user: member });
  });

  it("runs a chunk that needs only the bundler's runtime as soon as it arrives, and no chunk that needs a library", () => {
    expect(runEarly(boot.html("/stockroom", { user: member, facility }))).toEqual(["assets/data-D.js"]);
    expect(runEarly(boot.html("/sign-in", { user: null, facility }))).toEqual([]);
  });

  it("sends a visitor who is not signed in the sign-in screen's code, whatever the address", () => {
    const html = boot.html("/stockroom/", { user: null, facility });
    expect(preloads(html)).toEqual(["assets/sign-in-I.js"]);
    expect(block(html)).toEqual({ facility, user: null });
  });

  it("writes the person's data so that no text in it can end the script element", () => {
    const html = boot.html("/", { user: { ...member, name: "</script><script>alert(1)</script>" }, facility });
    expect(html.match(/<\/script>/g)).toHaveLength(3); // the entry's, the warm-up line's and the block's own
    expect((block(html) as { user: { name: string } }).user.name).toBe("</script><script>alert(1)</script>");
  });

  const rootOf = (html: string) => /<div id="root">([\s\S]*)<\/div>\n<noscript>/.exec(html)![1]!;

  it("writes a signed-in screen's title and description into its page, above the waiting line, with the warm-up line", () => {
    const html = boot.html("/stockroom", { user: member, facility });
    expect(html).toContain("<title>Stockroom · Phasebook</title>");
    const root = rootOf(html);
    expect(root).toContain('<h1 class="text-lg font-semibold tracking-tight text-grey-900">Stockroom</h1>');
    // "container's": words are written as they are, with only &, <, > and " escaped.
    expect(root).toContain(`<p class="mt-0.5 max-w-3xl text-grey-600">${SCREEN_HEADS.stockroom.description}</p>`);
    expect(root).toMatch(/<\/p><\/div><\/div><div role="status">Loading Phasebook…<\/div>/);
    expect(html).toContain(`<script>${WARM_UP}</script><title>`);
  });

  it("draws the outline with the frame's and the page header's own classes, so the screen replaces it in place", () => {
    const root = rootOf(boot.html("/stockroom", { user: member, facility }));
    const shell = fs.readFileSync("src/layouts/app-shell.tsx", "utf8");
    const header = fs.readFileSync("src/components/ui/page-header.tsx", "utf8");
    const classes = [...root.matchAll(/class="([^"]+)"/g)].map((m) => m[1]!);
    // The top bar, the main area and its width; the page header's box, title and description.
    for (const c of [classes[1], classes[4], classes[5]]) expect(shell, c).toContain(`className="${c}"`);
    for (const c of [classes[6], classes[7], classes[8], classes[9]]) expect(header, c).toContain(`className="${c}"`);
  });

  it("writes no head the person may not open, none for a record's page, and nothing but the waiting line when signed out", () => {
    for (const address of ["/safety", "/admin/people", "/stockroom/chemicals/12"]) {
      const html = boot.html(address, { user: member, facility });
      expect(rootOf(html), address).toBe('<div role="status">Loading Phasebook…</div>');
      expect(html).toContain("<title>Phasebook</title>");
    }
    const officer = { ...member, roles: ["safety_officer" as const] };
    expect(rootOf(boot.html("/safety", { user: officer, facility }))).toContain(">Safety review</h1>");
    const signedOut = boot.html("/stockroom", { user: null, facility });
    expect(rootOf(signedOut)).toBe('<div role="status">Loading Phasebook…</div>');
    expect(signedOut).not.toContain(WARM_UP);
  });

  it("leaves the session to GET /api/auth/me when the person does not fit the session schema", () => {
    const html = boot.html("/", { user: { ...member, roles: "member" } as unknown as Express.User, facility });
    expect(block(html)).toEqual({ facility });
  });
});

describe("the search text's limit", () => {
  it("is worded with the limit's own figure (written out so the schemas load without Intl)", () => {
    const result = searchText.safeParse("x".repeat(SEARCH_MAX + 1));
    expect(result.success).toBe(false);
    expect(result.error?.issues[0]?.message).toBe(`Search for at most ${SEARCH_MAX.toLocaleString("en")} characters`);
  });
});
