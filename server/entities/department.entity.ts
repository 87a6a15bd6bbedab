import { Column, Entity, Index, PrimaryGeneratedColumn } from "typeorm";

/** A university department whose groups use the facility. */
@Entity("departments")
export class Department {
  @PrimaryGeneratedColumn("increment") id: number;
  @Index({ unique: true }) @Column("text") code: string;
  @Column("text") name: string;
}
