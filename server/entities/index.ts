import { Account } from "./account.entity";
import { AccountMember } from "./account-member.entity";
import { AuditEntry } from "./audit-entry.entity";
import { BillingAdjustment } from "./billing-adjustment.entity";
import { BillingRun } from "./billing-run.entity";
import { ChargeLine } from "./charge-line.entity";
import { JournalLine } from "./journal-line.entity";
import { ProcessedEvent } from "./processed-event.entity";
import { Rate } from "./rate.entity";
import { Statement } from "./statement.entity";
import { Booking } from "./booking.entity";
import { BookingInstrument } from "./booking-instrument.entity";
import { Chemical } from "./chemical.entity";
import { ContainerUsage } from "./container-usage.entity";
import { Container } from "./container.entity";
import { ContainerMovement } from "./container-movement.entity";
import { Department } from "./department.entity";
import { Instrument } from "./instrument.entity";
import { InstrumentFault } from "./instrument-fault.entity";
import { LabelHistory } from "./label-history.entity";
import { LabelStock } from "./label-stock.entity";
import { Location } from "./location.entity";
import { LocationLimit } from "./location-limit.entity";
import { OutboundMail } from "./outbound-mail.entity";
import { PasswordReset } from "./password-reset.entity";
import { ResearchGroup } from "./research-group.entity";
import { SafetyDataSheet } from "./safety-data-sheet.entity";
import { SessionRow } from "./session.entity";
import { Setting } from "./setting.entity";
import { SolutionComponent } from "./solution-component.entity";
import { StockAlert } from "./stock-alert.entity";
import { Setup } from "./setup.entity";
import { SetupInstrument } from "./setup-instrument.entity";
import { TrainingRecord } from "./training-record.entity";
import { TrainingRequest } from "./training-request.entity";
import { User } from "./user.entity";
import { UserRole } from "./user-role.entity";
import { IonTransferSolvent } from "./ion-transfer-solvent.entity";
import { IonTransferIon } from "./ion-transfer-ion.entity";
import { RunPlan } from "./run-plan.entity";
import { Reservation } from "./reservation.entity";

export {
  Account, AccountMember, AuditEntry, Booking, BookingInstrument, Chemical, Container, ContainerUsage, Department, Instrument, InstrumentFault, LabelHistory, LabelStock, Location,
  OutboundMail, PasswordReset, ResearchGroup, SessionRow, Setting, TrainingRecord, User, UserRole,
  Setup, SetupInstrument, TrainingRequest,
  BillingAdjustment, BillingRun, ChargeLine, JournalLine, ProcessedEvent, Rate, Statement,
};
// Stockroom and safety review.
export { ContainerMovement, LocationLimit, SafetyDataSheet, SolutionComponent, StockAlert };
// Run plans.
export { IonTransferSolvent, IonTransferIon, RunPlan, Reservation };

export const entities = [
  Account, AccountMember, AuditEntry, Booking, BookingInstrument, Chemical, Container, ContainerUsage, Department, Instrument, InstrumentFault, LabelHistory, LabelStock, Location,
  OutboundMail, PasswordReset, ResearchGroup, SessionRow, Setting, TrainingRecord, User, UserRole,
  ContainerMovement, LocationLimit, SafetyDataSheet, SolutionComponent, StockAlert,
  Setup, SetupInstrument, TrainingRequest,
  BillingAdjustment, BillingRun, ChargeLine, JournalLine, ProcessedEvent, Rate, Statement,
  IonTransferSolvent, IonTransferIon, RunPlan, Reservation,
];
