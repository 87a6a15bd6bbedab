import { Column, Entity, Index, PrimaryGeneratedColumn } from "typeorm";

export type LabelSize = "vial" | "bottle";

/**
 * A label stock the facility prints on, described only by its dimensions in millimetres:
 * the page, the label, how many across and down, the margins to the first label and the gaps
 * between labels. A roll of single labels is a page holding one label (1 × 1, no margins).
 */
@Entity("label_stocks")
export class LabelStock {
  @PrimaryGeneratedColumn("increment") id: number;
  @Index({ unique: true }) @Column("text") name: string;
  /** Which label design fits: the small vial label or the larger bottle label. */
  @Column("text") size: LabelSize;
  @Column("real") pageWidthMm: number;
  @Column("real") pageHeightMm: number;
  @Column("real") labelWidthMm: number;
  @Column("real") labelHeightMm: number;
  @Column("integer") columns: number;
  @Column("integer") rows: number;
  @Column("real", { default: 0 }) marginTopMm: number;
  @Column("real", { default: 0 }) marginLeftMm: number;
  @Column("real", { default: 0 }) gapXMm: number;
  @Column("real", { default: 0 }) gapYMm: number;
  @Column("text") createdAt: string;
}
