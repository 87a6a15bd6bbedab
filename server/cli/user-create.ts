/**
 * Creates a person and prints a one-time link to choose their password (nothing secret goes on
 * the command line): npm run user:create -- --email ada@example.edu --name "Ada Lovelace" --role admin
 * Repeat --role for several roles. The link is a password-reset link; it works once.
 */
import { ROLES } from "@shared/schemas/auth";
import { loadConfig } from "../config";
import { openDatabase } from "../db/data-source";
import { Refusal, readArgs, runCli } from "../ops/cli";
import { createPersonWithLink } from "../ops/create-person";

const USAGE = `npm run user:create -- --email <address> --name "<full name>" --role <${ROLES.join("|")}> [--role …] [--valid-hours 24]`;

await runCli("Creating the person", async () => {
  const { values } = readArgs(
    {
      options: {
        email: { type: "string" },
        name: { type: "string" },
        role: { type: "string", multiple: true },
        "valid-hours": { type: "string" },
      },
      strict: true,
      allowPositionals: false,
    },
    USAGE,
  );
  if (!values.email || !values.name || !values.role?.length) throw new Refusal(`Give --email, --name and at least one --role. Usage: ${USAGE}`, 2);
  const validHours = values["valid-hours"] === undefined ? 24 : Number(values["valid-hours"]);
  const config = loadConfig();
  const ds = await openDatabase(config.DATABASE_PATH);
  try {
    const p = await createPersonWithLink(
      ds,
      { email: values.email, name: values.name, roles: values.role as (typeof ROLES)[number][], validHours },
      { now: new Date(), publicUrl: config.PUBLIC_URL },
    );
    console.log(
      [
        `Created ${values.name.trim()} <${p.email}> with the role${p.roles.length > 1 ? "s" : ""} ${p.roles.join(", ")}.`,
        `Send them this link to choose a password; it works once, until ${p.expiresAt.replace("T", " ").slice(0, 16)} UTC:`,
        "",
        `  ${p.link}`,
        "",
      ].join("\n"),
    );
  } finally {
    await ds.destroy();
  }
});
