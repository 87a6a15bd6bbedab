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

/** A place: building › room › cabinet or shelf. Its storage limits by liquid class are LocationLimit rows. */
@Entity("locations")
export class Location {
  @PrimaryGeneratedColumn("increment") id: number;
  @Column("integer", { nullable: true }) parentId: number | null;
  @Column("text") level: LocationLevel;
  @Column("text") name: string;
  @Column("text", { default: "general" }) type: LocationType;
  /** Where the location's limits come from, e.g. "Example only: OSHA 1910.106 cabinet limit". */
  @Column("text", { default: "" }) limitNote: string;

  @ManyToOne("Location", { onDelete: "RESTRICT", nullable: true })
  @JoinColumn({ name: "parentId" })
  parent?: unknown;

}
