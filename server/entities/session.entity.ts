import { Column, Entity, Index, PrimaryColumn } from "typeorm";

/** A signed-in browser session, kept in the database so a restart keeps people signed in. */
@Entity("sessions")
export class SessionRow {
  @PrimaryColumn("text") sid: string;
  @Index() @Column("integer", { nullable: true }) userId: number | null;
  @Index() @Column("integer") expiresAtMs: number;
  @Column("text") data: string;
}
