import { Account } from "./account.entity";
import { AccountMember } from "./account-member.entity";
import { AuditEntry } from "./audit-entry.entity";
import { BillingAdjustment } from "./billing-adjustment.entity";
import { BillingRun } from "./billing-run.entity";
import { ChargeLine } from "./charge-line.entity";
import { ProcessedEvent } from "./processed-event.entity";
import { Rate } from "./rate.entity";
import { Statement } from "./statement.entity";
import { Booking } from "./booking.entity";
import { BookingInstrument } from "./booking-instrument.entity";
import { Chemical } from "./chemical.entity";
import { ContainerUsage } from "./container-usage.entity";
import { Container } from "./container.entity";
import { Department } from "./department.entity";
import { Instrument } from "./instrument.entity";
import { Location } from "./location.entity";
import { OutboundMail } from "./outbound-mail.entity";
import { PasswordReset } from "./password-reset.entity";
import { ResearchGroup } from "./research-group.entity";
import { SessionRow } from "./session.entity";
import { Setting } from "./setting.entity";
import { TrainingRecord } from "./training-record.entity";
import { User } from "./user.entity";
import { UserRole } from "./user-role.entity";

export {
  Account, AccountMember, AuditEntry, Booking, BookingInstrument, Chemical, Container, ContainerUsage, Department, Instrument, Location,
  OutboundMail, PasswordReset, ResearchGroup, SessionRow, Setting, TrainingRecord, User, UserRole,
  BillingAdjustment, BillingRun, ChargeLine, ProcessedEvent, Rate, Statement,
};

export const entities = [
  Account, AccountMember, AuditEntry, Booking, BookingInstrument, Chemical, Container, ContainerUsage, Department, Instrument, Location,
  OutboundMail, PasswordReset, ResearchGroup, SessionRow, Setting, TrainingRecord, User, UserRole,
  BillingAdjustment, BillingRun, ChargeLine, ProcessedEvent, Rate, Statement,
];
