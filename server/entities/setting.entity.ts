import { Column, Entity, PrimaryColumn } from "typeorm";

/** A facility setting as JSON under a key (billing policy, review periods, label stock…). */
@Entity("settings")
export class Setting {
  @PrimaryColumn("text") key: string;
  @Column("text") value: string;
}
