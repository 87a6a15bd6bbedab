import { Column, Entity, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from "typeorm";

export type LocationLevel = "building" | "room" | "cabinet" | "shelf";
export type LocationType =
  | "general"
  | "flammable_cabinet"
  | "corrosives_cabinet"
  | "fridge"
  | "bench"
  | "fume_hood"
  | "waste_area";

/** A place: building › room › cabinet or shelf, with the storage limits the safety office sets. */
@Entity("locations")
export class Location {
  @PrimaryGeneratedColumn("increment") id: number;
  @Column("integer", { nullable: true }) parentId: number | null;
  @Column("text") level: LocationLevel;
  @Column("text") name: string;
  @Column("text", { default: "general" }) type: LocationType;
  /** Litres of GHS category 1–3 flammable liquids allowed here (null: no limit set). */
  @Column("real", { nullable: true }) flammableLimitLitres: number | null;
  /** Litres of category 4 combustible liquids allowed here. */
  @Column("real", { nullable: true }) combustibleLimitLitres: number | null;
  /** Where the limit comes from, e.g. "Example only: OSHA 1910.106 cabinet limit". */
  @Column("text", { default: "" }) limitNote: string;

  @ManyToOne("Location", { onDelete: "RESTRICT", nullable: true })
  @JoinColumn({ name: "parentId" })
  parent?: unknown;

}
