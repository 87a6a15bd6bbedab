import { Column, Entity, Index, PrimaryGeneratedColumn } from "typeorm";

/** A named set of instruments usually booked together, e.g. a potentiostat with an interface cell. */
@Entity("setups")
export class Setup {
  @PrimaryGeneratedColumn("increment") id: number;
  @Index({ unique: true }) @Column("text") name: string;
  @Column("text", { default: "" }) description: string;
  @Column("text") createdAt: string;
}
