import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from "typeorm";
import type { NfpaClass } from "@shared/domain/hazards";

/**
 * A storage limit the safety office set on a location: the most litres of a group of fire-code
 * liquid classes (e.g. Class IA alone, Class I together, Classes I + II + IIIA together), and
 * whether containers in approved cabinets inside the location count toward it. The volume is
 * kept in litres and also as typed (L or US gal), to show it back as entered.
 */
@Entity("location_limits")
@Index(["locationId"])
export class LocationLimit {
  @PrimaryGeneratedColumn("increment") id: number;
  @Column("integer") locationId: number;
  /** JSON array of NFPA 30 classes, e.g. ["IA","IB","IC"]. */
  @Column("text") classes: string;
  @Column("real") maxLitres: number;
  @Column("real") enteredVolume: number;
  @Column("text") enteredUnit: "L" | "US gal";
  @Column("boolean", { default: true }) includesCabinets: boolean;
  @Column("text", { default: "" }) note: string;
  @Column("text") createdAt: string;

  @ManyToOne("Location", { onDelete: "CASCADE", nullable: false })
  @JoinColumn({ name: "locationId" })
  location?: unknown;
}

export const parseClasses = (json: string): NfpaClass[] => JSON.parse(json) as NfpaClass[];
