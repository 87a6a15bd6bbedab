/**
 * The lint boundaries (eslint.config.js, eslint-plugin-boundaries) refuse imports across areas:
 * the same ESLint that `npm run lint` runs is given small files placed in the tree and must
 * flag the forbidden imports and pass the allowed ones.
 */
import { describe, expect, it } from "vitest";
import { ESLint } from "eslint";

const eslint = new ESLint({ overrideConfigFile: "eslint.config.js" });

async function boundaryErrors(filePath: string, code: string): Promise<string[]> {
  const [result] = await eslint.lintText(code, { filePath });
  return result.messages.filter((m) => m.ruleId?.startsWith("boundaries/")).map((m) => m.message);
}

describe("npm run lint's area boundaries", () => {
  it("refuses a client feature that imports another feature", async () => {
    const errors = await boundaryErrors("src/features/schedule/components/lint-probe.tsx", `import { useChemicals } from "@/features/stockroom/api/get-chemicals";\nexport const probe = useChemicals;\n`);
    expect(errors).toEqual([expect.stringMatching(/does not import another feature/)]);
  });

  it("lets a feature import its own parts and the shared lib", async () => {
    const errors = await boundaryErrors(
      "src/features/stockroom/components/lint-probe.tsx",
      `import { useChemicals } from "@/features/stockroom/api/get-chemicals";\nimport { hasRole } from "@/lib/auth";\nexport const probe = [useChemicals, hasRole];\n`,
    );
    expect(errors).toEqual([]);
  });

  it("refuses src/lib importing a feature", async () => {
    const errors = await boundaryErrors("src/lib/lint-probe.ts", `import { useChemicals } from "@/features/stockroom/api/get-chemicals";\nexport const probe = useChemicals;\n`);
    expect(errors).toEqual([expect.stringMatching(/imports none of them/)]);
  });

  it("refuses a server area reaching into another area's files, and allows its public entry", async () => {
    const inside = await boundaryErrors("server/modules/labels/lint-probe.ts", `import { containerPolicy } from "../stockroom/container.policy";\nexport const probe = containerPolicy;\n`);
    expect(inside).toEqual([expect.stringMatching(/only through its public entry/)]);
    const entry = await boundaryErrors("server/modules/labels/lint-probe.ts", `import { containerPolicy } from "../stockroom";\nexport const probe = containerPolicy;\n`);
    expect(entry).toEqual([]);
  });

  it("refuses a demo seed importing area code", async () => {
    const errors = await boundaryErrors("server/db/seed/lint-probe.ts", `import { stockroomTable } from "../../modules/stockroom";\nexport const probe = stockroomTable;\n`);
    expect(errors).toEqual([expect.stringMatching(/import no route or area code/)]);
  });
});
