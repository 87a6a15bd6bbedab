/**
 * The client's index.html as each page load gets it. The built file is the same for every page;
 * what the server knows about this load is written into its head, so the first screen does not
 * wait for round trips it can skip:
 *
 * - who is signed in (the answer GET /api/auth/me would give, `{ user }` or `{ user: null }`)
 *   and the facility's settings (GET /api/facility), as a JSON block the client reads once at
 *   start (src/lib/session/page-boot.ts) instead of asking for them after its code has arrived;
 * - `modulepreload` links for the code of the screen this address opens (and the signed-in frame
 *   around it), read from Vite's build manifest, so that code comes with the first scripts
 *   instead of after them. A visitor who is not signed in gets the sign-in screen's code
 *   whatever the address: that is where the client sends them;
 * - the chunks that need none of the libraries (zod and the shared schemas) as async module
 *   scripts as well, so they run as soon as they arrive, not in the screen's task after the
 *   libraries;
 * - for a signed-in page: a line that loads the browser's locale data and opens its
 *   sessionStorage while the scripts are on the way (WARM_UP), and, on a screen whose head says
 *   the same to everyone, the frame's outline with that title and description in place of the
 *   bare waiting line, so the page says what it is at its first paint (React replaces it whole
 *   when the screen is ready).
 *
 * PAGE_MODULES follows the client's route table (src/app/router.tsx): each address's screen
 * module. The route loaders need no line: the build puts them in their area's data chunk
 * (vite.config.ts), which the screen's own code imports, so they come with its preloads.
 * tests/unit/page-boot.test.ts checks that the table and the router name the same screens and
 * every address of src/config/paths.ts, each guarded address with its area, and each head with
 * the screen that shows it; tests/e2e/client-loading.test.ts checks that the built manifest holds
 * every screen named here and that the screen, once drawn, shows the head the page load carried.
 */
import crypto from "node:crypto";
import fs from "node:fs";
import path from "node:path";
import { sessionDto } from "@shared/schemas/auth";
import { AREA_ROLES, type Area } from "@shared/areas";
import { SCREEN_HEADS, type ScreenHead, type ScreenHeadName } from "@shared/screens";
import type { FacilityDto } from "@shared/schemas/facility";

const FRAME = "src/app/routes/signed-in-frame.tsx";
const SIGN_IN = "src/app/routes/sign-in.tsx";
const routes = (name: string) => `src/app/routes/${name}.tsx`;

/**
 * Address pattern → its screen's module; `public` pages need no sign-in. `head`: the words the
 * screen shows at its head (shared/screens.ts), written into the page load for a signed-in person
 * who may open the screen (`area`: the area whose roles its route guard asks for).
 */
export const PAGE_MODULES: { path: string; screen: string; public?: true; head?: ScreenHeadName; area?: Area }[] = [
  { path: "/sign-in", screen: SIGN_IN, public: true },
  { path: "/forgot-password", screen: routes("forgot-password"), public: true },
  { path: "/reset-password/:token", screen: routes("reset-password"), public: true },
  { path: "/", screen: routes("home") },
  { path: "/schedule", screen: routes("schedule"), head: "schedule" },
  { path: "/schedule/approvals", screen: routes("approvals"), head: "approvals", area: "training" },
  { path: "/schedule/utilisation", screen: routes("utilisation"), head: "utilisation", area: "training" },
  { path: "/schedule/settings", screen: routes("schedule-settings"), head: "scheduleSettings", area: "training" },
  { path: "/bookings", screen: routes("my-bookings"), head: "myBookings" },
  { path: "/instruments", screen: routes("instruments"), head: "instruments" },
  { path: "/instruments/:id", screen: routes("instrument") },
  { path: "/training", screen: routes("training"), head: "training", area: "training" },
  { path: "/stockroom", screen: routes("stockroom"), head: "stockroom" },
  { path: "/stockroom/chemicals", screen: routes("stockroom"), head: "stockroom" },
  { path: "/stockroom/chemicals/:id", screen: routes("stockroom-chemical") },
  { path: "/stockroom/containers/:id", screen: routes("stockroom-container") },
  { path: "/stockroom/receive", screen: routes("stockroom-receive"), head: "receive", area: "safety" },
  { path: "/stockroom/prepare", screen: routes("stockroom-prepare"), head: "prepare" },
  { path: "/stockroom/import", screen: routes("stockroom-import"), head: "stockImport", area: "safety" },
  { path: "/run-plans/new", screen: routes("run-plan-new"), head: "runPlanNew" },
  { path: "/run-plans/:id", screen: routes("run-plan") },
  { path: "/scan", screen: routes("scan"), head: "scan" },
  { path: "/s/:token", screen: routes("scan-token") },
  { path: "/recharge", screen: routes("recharge"), head: "recharge", area: "recharge" },
  { path: "/charges", screen: routes("my-charges") },
  { path: "/safety", screen: routes("safety"), head: "safety", area: "safety" },
  { path: "/safety/locations", screen: routes("safety-locations"), head: "safetyLocations", area: "safety" },
  { path: "/admin/people", screen: routes("admin/people"), head: "people", area: "admin" },
  { path: "/admin/mailbox", screen: routes("admin/mailbox"), head: "system", area: "admin" },
  { path: "/profile", screen: routes("profile"), head: "profile" },
];

/** Whether `pathname` is an address of `pattern` (":name" stands for any one non-empty segment). */
function matches(pattern: string, pathname: string): boolean {
  const want = pattern.split("/");
  const got = pathname.replace(/(.)\/+$/, "$1").split("/");
  return want.length === got.length && want.every((part, i) => (part.startsWith(":") ? got[i] !== "" : part === got[i]));
}

interface ManifestChunk {
  file: string;
  imports?: string[];
  isEntry?: boolean;
}
type Manifest = Record<string, ManifestChunk>;

/** Every chunk a manifest entry needs (itself and its static imports, depth first), skipping entries in `seen`. */
function chunksOf(manifest: Manifest, key: string, seen = new Set<string>()): string[] {
  const chunk = manifest[key];
  if (!chunk || seen.has(key)) return [];
  seen.add(key);
  return [key, ...(chunk.imports ?? []).flatMap((k) => chunksOf(manifest, k, seen))];
}

/** What the page load tells the client about itself (src/lib/session/page-boot.ts reads it). */
export interface PageFacts {
  user: Express.User | null;
  facility: FacilityDto;
}

export interface PageBoot {
  /** The index.html for one page load: `pathname` as the browser asked for it. */
  html(pathname: string, facts: PageFacts): string;
}

/**
 * Two first uses that make the page wait: the browser's first use of Intl loads its locale data
 * (about 50 ms of main-thread time on a desk computer, four times that on a phone, taken from the
 * first render that shows a date or a number), and its first use of sessionStorage asks the
 * browser process for it (3–13 ms measured here; the router reads it when it starts). A signed-in
 * page runs this one line while its scripts are still on the way and the main thread is idle (in
 * a task of its own, after the page is parsed), so the app starts and the first screen renders
 * without either pause.
 */
export const WARM_UP = "setTimeout(function(){try{new Intl.DateTimeFormat().format(0);sessionStorage.length}catch(e){}})";
/** The Content-Security-Policy source that allows `WARM_UP` and no other inline script. */
export const WARM_UP_SOURCE = `'sha256-${crypto.createHash("sha256").update(WARM_UP).digest("base64")}'`;

const escapeHtml = (text: string) => text.replace(/[&<>"]/g, (c) => `&${{ "&": "amp", "<": "lt", ">": "gt", '"': "quot" }[c]};`);

/**
 * What a signed-in page shows until its screen is ready: the frame's outline (src/layouts/
 * app-shell.tsx, same classes) with the screen's title and description as PageHeader sets them
 * (src/components/ui/page-header.tsx), then the waiting line. React replaces it whole.
 */
function frameWithHead(head: ScreenHead, waiting: string): string {
  return (
    '<div class="flex min-h-screen flex-col">' +
    '<div class="sticky top-0 z-30 flex h-12 items-center gap-2 border-b border-grey-200 bg-white/95 px-3 backdrop-blur md:px-4"></div>' +
    '<div class="flex flex-1"><div class="hidden border-grey-200 bg-white md:block md:w-52 md:shrink-0 md:border-r"></div>' +
    '<div class="min-w-0 flex-1 px-4 py-4 focus:outline-none md:px-6 md:py-5"><div class="mx-auto max-w-6xl">' +
    '<div class="mb-4 flex flex-wrap items-end justify-between gap-3 border-b border-grey-200 pb-3"><div class="min-w-0">' +
    `<h1 class="text-lg font-semibold tracking-tight text-grey-900">${escapeHtml(head.title)}</h1>` +
    `<p class="mt-0.5 max-w-3xl text-grey-600">${escapeHtml(head.description)}</p>` +
    `</div></div>${waiting}</div></div></div></div>`
  );
}

/** `<` written as \u003c, so no text in the data can close the script element around it. */
const jsonForScript = (value: unknown) => JSON.stringify(value).replace(/</g, "\\u003c").replace(/\u2028/g, "\\u2028").replace(/\u2029/g, "\\u2029");

/**
 * Reads the built index.html and manifest once. Without a manifest (a build made before it was
 * written) pages still get the session block, and no preloads.
 */
export function createPageBoot(staticDir: string): PageBoot {
  const template = fs.readFileSync(path.join(staticDir, "index.html"), "utf8");
  // index.html's #root holds the waiting line, and the <noscript> follows it.
  const rootMatch = /<div id="root">([\s\S]*)<\/div>(\s*<noscript>)/.exec(template);
  const root = rootMatch ? { whole: rootMatch[0], waiting: rootMatch[1]!, after: rootMatch[2]! } : null;
  const manifestFile = path.join(staticDir, ".vite", "manifest.json");
  const manifest: Manifest = fs.existsSync(manifestFile) ? (JSON.parse(fs.readFileSync(manifestFile, "utf8")) as Manifest) : {};
  const entryKey = Object.keys(manifest).find((key) => manifest[key]!.isEntry);
  // The entry and what it imports are in the template already.
  const inTemplate = new Set(entryKey ? chunksOf(manifest, entryKey) : []);
  // A chunk that needs nothing the entry loads but the bundler's runtime (a chunk that imports
  // nothing) waits for no library: the page runs it as soon as it arrives (an async module
  // script), in a task of its own while the libraries are still on the way, instead of in the
  // screen's one long task after them. zod and the shared schemas are such chunks: building the
  // schemas is most of that task.
  const importsNothing = (key: string) => !manifest[key]?.imports?.length;
  const runsAlone = (key: string) => chunksOf(manifest, key).every((k) => k === key || !inTemplate.has(k) || importsNothing(k));
  const preloadsFor = (modules: string[]) => {
    const seen = new Set<string>();
    const chunks = modules.flatMap((m) => chunksOf(manifest, m, seen)).filter((key) => !inTemplate.has(key));
    const link = (key: string) => `<link rel="modulepreload" crossorigin href="/${manifest[key]!.file}">`;
    const early = (key: string) => `<script type="module" async crossorigin src="/${manifest[key]!.file}"></script>`;
    return chunks.map(link).join("") + chunks.filter(runsAlone).map(early).join("");
  };
  // The signed-in page's template (with the warm-up line), and the same with each screen's head,
  // made once; a page load only adds its preloads and session block.
  const signedInTemplate = template.replace("<title>", `<script>${WARM_UP}</script><title>`);
  const headed = new Map<ScreenHeadName, string>();
  const templateWithHead = (name: ScreenHeadName) => {
    let html = headed.get(name);
    if (html === undefined) {
      const words = SCREEN_HEADS[name];
      html = root
        ? signedInTemplate
            .replace(/<title>[^<]*<\/title>/, `<title>${escapeHtml(words.title)} · Phasebook</title>`)
            .replace(root.whole, `<div id="root">${frameWithHead(words, root.waiting)}</div>${root.after}`)
        : signedInTemplate;
      headed.set(name, html);
    }
    return html;
  };
  const cache = new Map<string, string>();
  const linksFor = (modules: string[]) => {
    const key = modules.join(",");
    let links = cache.get(key);
    if (links === undefined) cache.set(key, (links = preloadsFor(modules)));
    return links;
  };

  return {
    html(pathname, facts) {
      const page = PAGE_MODULES.find((p) => matches(p.path, pathname));
      const signedIn = facts.user !== null;
      let modules: string[] = [];
      if (!signedIn) modules = [page?.public ? page.screen : SIGN_IN];
      else if (page && !page.public) modules = [FRAME, page.screen];
      // A person the session schema does not describe is left to GET /api/auth/me to explain.
      const session = signedIn ? sessionDto.safeParse({ user: facts.user }) : null;
      const boot = { facility: facts.facility, ...(session === null ? { user: null } : session.success ? { user: session.data.user } : {}) };
      const head = `${linksFor(modules)}<script type="application/json" id="phasebook-boot">${jsonForScript(boot)}</script>`;
      const shownHead = facts.user && page?.head && (!page.area || AREA_ROLES[page.area].some((r) => facts.user!.roles.includes(r))) ? page.head : undefined;
      const base = !signedIn ? template : shownHead ? templateWithHead(shownHead) : signedInTemplate;
      return base.replace("</head>", `${head}</head>`);
    },
  };
}
