import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from "typeorm";

export type InstrumentKind = "potentiostat" | "interface_cell" | "support";
export type InstrumentStatus = "in_service" | "under_maintenance" | "retired";

/** A bookable thing: potentiostat, interface cell or support equipment, with its booking rules. */
@Entity("instruments")
export class Instrument {
  @PrimaryGeneratedColumn("increment") id: number;
  @Index({ unique: true }) @Column("text") name: string;
  @Column("text") kind: InstrumentKind;
  @Column("text", { default: "in_service" }) status: InstrumentStatus;
  @Column("text", { default: "" }) model: string;
  @Column("text", { default: "" }) serialNumber: string;
  @Column("text", { default: "" }) description: string;
  @Column("integer", { nullable: true }) locationId: number | null;
  /** Potentiostats: can drive a four-electrode cell. */
  @Column("boolean", { default: false }) fourElectrode: boolean;
  /** Interface cells: interfacial area in cm². */
  @Column("real", { nullable: true }) interfaceAreaCm2: number | null;
  /** Micro-interface cells: radius of the inlaid disc interface in cm. */
  @Column("real", { nullable: true }) interfaceRadiusCm: number | null;
  /** Interface cells: volume of each phase a run fills in, mL (what a run plan weighs for). */
  @Column("real", { nullable: true }) aqueousFillMl: number | null;
  @Column("real", { nullable: true }) organicFillMl: number | null;
  @Column("boolean", { default: true }) trainingRequired: boolean;
  @Column("boolean", { default: false }) requiresApproval: boolean;
  @Column("integer", { default: 0 }) cleaningBufferMinutes: number;
  @Column("integer", { default: 0 }) minLeadMinutes: number;
  @Column("integer", { default: 480 }) maxLengthMinutes: number;
  /** JSON: { mon: [{ from: "08:00", to: "18:00" }], ... } in the facility's local time. */
  @Column("text", { default: "{}" }) bookableHours: string;
  @Column("boolean", { default: false }) afterHoursAllowed: boolean;
  @Index({ unique: true }) @Column("text") labelToken: string;
  @Column("text") createdAt: string;

  @ManyToOne("Location", { onDelete: "SET NULL", nullable: true })
  @JoinColumn({ name: "locationId" })
  location?: unknown;

}
