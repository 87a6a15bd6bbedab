import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from "typeorm";

/** A single-use password reset link; only the token's hash is kept. */
@Entity("password_resets")
export class PasswordReset {
  @PrimaryGeneratedColumn("increment") id: number;
  @Column("integer") userId: number;
  @Index({ unique: true }) @Column("text") tokenHash: string;
  @Column("text") expiresAt: string;
  @Column("text", { nullable: true }) usedAt: string | null;
  @Column("text") createdAt: string;

  @ManyToOne("User", { onDelete: "CASCADE", nullable: false })
  @JoinColumn({ name: "userId" })
  user?: unknown;

}
