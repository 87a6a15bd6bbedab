/**
 * An ion's name and charge, and the ions a Stockroom chemical gives when it dissolves (LiCl → Li+
 * + Cl−), kept on the chemical. Their own module, so the Stockroom's schemas do not bring the run
 * plans' and the ion table's with them (a page builds every schema of the modules it loads).
 */
import { z } from "zod";

/** A charge number: a whole number from −6 to +6, never 0. */
export const ionCharge = z
  .number({ message: "Enter the charge as a whole number" })
  .int("The charge must be a whole number")
  .min(-6, "The charge must be between −6 and +6")
  .max(6, "The charge must be between −6 and +6")
  .refine((value) => value !== 0, "The charge cannot be 0: a neutral species does not carry current across the interface");

/** An ion name as the trade writes it, ending in its sign: Li+, TB(C6F5)4-, SO4 2-. */
export const ionSymbol = z
  .string({ message: "Name the ion, e.g. Li+ or TB(C6F5)4-" })
  .trim()
  .min(2, "Name the ion with its sign, e.g. Li+ or Cl-")
  .max(40, "An ion's name is at most 40 characters")
  .regex(/^[^\s].*[+\-−]$/u, "Write the ion with its sign at the end, e.g. Li+ or Cl-");

/** One kind of ion a chemical gives, and how many per formula unit. */
export const chemicalIon = z.object({
  ion: ionSymbol,
  charge: ionCharge,
  count: z.number({ message: "Give how many per formula unit" }).int("A whole number per formula unit").min(1).max(6),
});
export type ChemicalIon = z.infer<typeof chemicalIon>;

/** The ions of an electrolyte, e.g. LiCl → [{ Li+, +1, 1 }, { Cl-, −1, 1 }]; null for a chemical that is not one. */
export const chemicalIons = z
  .array(chemicalIon)
  .min(2, "An electrolyte gives at least a cation and an anion")
  .max(6, "At most 6 kinds of ion")
  .nullable();
