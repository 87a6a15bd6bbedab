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
 *   whatever the address: that is where the client sends them.
 *
 * PAGE_MODULES follows the client's route table (src/app/router.tsx): each address's screen
 * module. The route loaders need no line: the build puts them in their area's data chunk
 * (vite.config.ts), which the screen's own code imports, so they come with its preloads.
 * tests/unit/page-boot.test.ts checks that the table and the router name the same screens and
 * every address of src/config/paths.ts; tests/e2e/client-loading.test.ts checks that the built
 * manifest holds every screen named here.
 */
import fs from "node:fs";
import path from "node:path";
import { sessionDto } from "@shared/schemas/auth";
import type { FacilityDto } from "@shared/schemas/facility";

const FRAME = "src/app/routes/signed-in-frame.tsx";
const SIGN_IN = "src/app/routes/sign-in.tsx";
const routes = (name: string) => `src/app/routes/${name}.tsx`;

/** Address pattern → its screen's module; `public` pages need no sign-in. */
export const PAGE_MODULES: { path: string; screen: string; public?: true }[] = [
  { path: "/sign-in", screen: SIGN_IN, public: true },
  { path: "/forgot-password", screen: routes("forgot-password"), public: true },
  { path: "/reset-password/:token", screen: routes("reset-password"), public: true },
  { path: "/", screen: routes("home") },
  { path: "/schedule", screen: routes("schedule") },
  { path: "/schedule/approvals", screen: routes("approvals") },
  { path: "/schedule/utilisation", screen: routes("utilisation") },
  { path: "/schedule/settings", screen: routes("schedule-settings") },
  { path: "/bookings", screen: routes("my-bookings") },
  { path: "/instruments", screen: routes("instruments") },
  { path: "/instruments/:id", screen: routes("instrument") },
  { path: "/training", screen: routes("training") },
  { path: "/stockroom", screen: routes("stockroom") },
  { path: "/stockroom/chemicals", screen: routes("stockroom") },
  { path: "/stockroom/chemicals/:id", screen: routes("stockroom-chemical") },
  { path: "/stockroom/containers/:id", screen: routes("stockroom-container") },
  { path: "/stockroom/receive", screen: routes("stockroom-receive") },
  { path: "/stockroom/prepare", screen: routes("stockroom-prepare") },
  { path: "/stockroom/import", screen: routes("stockroom-import") },
  { path: "/run-plans/new", screen: routes("run-plan-new") },
  { path: "/run-plans/:id", screen: routes("run-plan") },
  { path: "/scan", screen: routes("scan") },
  { path: "/s/:token", screen: routes("scan-token") },
  { path: "/recharge", screen: routes("recharge") },
  { path: "/charges", screen: routes("my-charges") },
  { path: "/safety", screen: routes("safety") },
  { path: "/safety/locations", screen: routes("safety") },
  { path: "/admin/people", screen: routes("admin/people") },
  { path: "/admin/mailbox", screen: routes("admin/mailbox") },
  { path: "/profile", screen: routes("profile") },
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

/** Every file a manifest entry needs (its own and its static imports', depth first), skipping entries in `seen`. */
function filesOf(manifest: Manifest, key: string, seen = new Set<string>()): string[] {
  const chunk = manifest[key];
  if (!chunk || seen.has(key)) return [];
  seen.add(key);
  return [chunk.file, ...(chunk.imports ?? []).flatMap((k) => filesOf(manifest, k, seen))];
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

/** `<` written as \u003c, so no text in the data can close the script element around it. */
const jsonForScript = (value: unknown) => JSON.stringify(value).replace(/</g, "\\u003c").replace(/\u2028/g, "\\u2028").replace(/\u2029/g, "\\u2029");

/**
 * Reads the built index.html and manifest once. Without a manifest (a build made before it was
 * written) pages still get the session block, and no preloads.
 */
export function createPageBoot(staticDir: string): PageBoot {
  const template = fs.readFileSync(path.join(staticDir, "index.html"), "utf8");
  const manifestFile = path.join(staticDir, ".vite", "manifest.json");
  const manifest: Manifest = fs.existsSync(manifestFile) ? (JSON.parse(fs.readFileSync(manifestFile, "utf8")) as Manifest) : {};
  const entryKey = Object.keys(manifest).find((key) => manifest[key]!.isEntry);
  // The entry and what it imports are in the template already.
  const inTemplate = new Set(entryKey ? filesOf(manifest, entryKey) : []);
  const preloadsFor = (modules: string[]) => {
    const seen = new Set<string>();
    const files = modules.flatMap((m) => filesOf(manifest, m, seen)).filter((file) => !inTemplate.has(file));
    return files.map((file) => `<link rel="modulepreload" crossorigin href="/${file}">`).join("");
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
      return template.replace("</head>", `${head}</head>`);
    },
  };
}
