import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from "typeorm";

/**
 * A supplier's safety data sheet (PDF) for a chemical. The file lives in the data folder under
 * a random name (storedName); originalName is only ever sent back as the download's name.
 */
@Entity("safety_data_sheets")
export class SafetyDataSheet {
  @PrimaryGeneratedColumn("increment") id: number;
  @Index() @Column("integer") chemicalId: number;
  @Column("text") originalName: string;
  @Column("text") storedName: string;
  @Column("integer") sizeBytes: number;
  /** SHA-256 of the file, to spot the same sheet uploaded twice. */
  @Column("text") sha256: string;
  @Column("text", { default: "" }) supplier: string;
  /** Date (YYYY-MM-DD) the sheet was issued or last reviewed; the review period counts from it. */
  @Column("text") reviewedOn: string;
  @Column("integer", { nullable: true }) uploadedById: number | null;
  @Column("text") uploadedAt: string;

  @ManyToOne("Chemical", { onDelete: "CASCADE", nullable: false })
  @JoinColumn({ name: "chemicalId" })
  chemical?: unknown;

  @ManyToOne("User", { onDelete: "SET NULL", nullable: true })
  @JoinColumn({ name: "uploadedById" })
  uploadedBy?: unknown;
}
