import { Column, Entity, Index, PrimaryGeneratedColumn } from "typeorm";

/**
 * An ion's standard transfer potential at water | solvent that the manager added (for a built-in
 * solvent or an added one), with the published source of the value. An added ion named like a
 * built-in one takes its place for that solvent.
 */
@Entity("ion_transfer_ions")
@Index(["solventKey", "ion"], { unique: true })
export class IonTransferIon {
  @PrimaryGeneratedColumn("increment") id: number;
  @Column("text") solventKey: string;
  @Column("text") ion: string;
  @Column("text", { default: "" }) name: string;
  @Column("integer") charge: number;
  @Column("real") standardPotentialV: number;
  @Column("text") source: string;
  @Column("real", { nullable: true }) diffusionAqueousCm2PerS: number | null;
  @Column("real", { nullable: true }) diffusionOrganicCm2PerS: number | null;
  @Column("integer", { nullable: true }) createdById: number | null;
  @Column("text") createdAt: string;
}
