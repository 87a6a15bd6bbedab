import { Column, Entity, Index, PrimaryGeneratedColumn } from "typeorm";

/** A substance with its identity and hazard data. Containers hold it. */
@Entity("chemicals")
export class Chemical {
  @PrimaryGeneratedColumn("increment") id: number;
  /** Indexed: the Stockroom lists chemicals, and containers by chemical, in name order. */
  @Index() @Column("text") name: string;
  /** JSON array of other names. */
  @Column("text", { default: "[]" }) synonyms: string;
  @Index() @Column("text") casNumber: string;
  @Column("text", { nullable: true }) formula: string | null;
  /** g/mol from the formula, or the override for solvates and salts whose bottle form differs. */
  @Column("real", { nullable: true }) molarMass: number | null;
  @Column("boolean", { default: false }) molarMassOverridden: boolean;
  /** JSON array of GHS H-codes. */
  @Column("text", { default: "[]" }) hazardStatements: string;
  /** JSON array of GHS pictogram codes (GHS01…GHS09). */
  @Column("text", { default: "[]" }) pictograms: string;
  @Column("text", { nullable: true }) signalWord: "Danger" | "Warning" | null;
  @Column("text", { default: "" }) precautions: string;
  /** Closed-cup flash point. */
  @Column("real", { nullable: true }) flashPointC: number | null;
  @Column("real", { nullable: true }) boilingPointC: number | null;
  @Column("real", { nullable: true }) densityGPerMl: number | null;
  @Column("boolean", { default: false }) carcinogen: boolean;
  @Column("boolean", { default: false }) acuteToxic: boolean;
  @Column("text", { default: "" }) storageGroup: string;
  @Column("real", { nullable: true }) reorderPoint: number | null;
  @Column("text", { nullable: true }) reorderUnit: string | null;
  /** Cost in cents per costUnit (e.g. per g or per mL). */
  @Column("integer", { nullable: true }) unitCostCents: number | null;
  @Column("text", { nullable: true }) costUnit: string | null;
  @Column("text", { nullable: true }) onHoldReason: string | null;
  /** Electrolytes: JSON [{ ion, charge, count }] of the ions one formula unit gives (LiCl → Li+, Cl−); null otherwise. */
  @Column("text", { nullable: true }) ions: string | null;
  @Column("text") createdAt: string;

}
