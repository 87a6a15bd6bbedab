import { Column, Entity, Index, PrimaryGeneratedColumn } from "typeorm";

/** A water | organic pair the manager added to the ion table, with the source of its data. */
@Entity("ion_transfer_solvents")
export class IonTransferSolvent {
  @PrimaryGeneratedColumn("increment") id: number;
  /** The API's id for it ("tft"); never one of the built-in table's ids. */
  @Index({ unique: true }) @Column("text") key: string;
  @Column("text") name: string;
  /** JSON array of other names a request may use. */
  @Column("text", { default: "[]" }) aliases: string;
  @Column("text", { nullable: true }) casNumber: string | null;
  @Column("text") source: string;
  @Column("integer", { nullable: true }) createdById: number | null;
  @Column("text") createdAt: string;
}
