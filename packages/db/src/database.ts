import type { AuditEventTable } from './audit/audit-event.table';
import type {
  LedgerEntryTable,
  PaymentRefundTable,
  PaymentTable,
  ShopSubscriptionTable,
  StripeEventTable,
  SubscriptionChangeTable,
  SubscriptionInvoiceTable,
} from './billing/billing.table';
import type { CalibrationFileTable } from './files/calibration-file.table';
import type { DatalogMappingTable, DatalogTable } from './datalogs/datalog.table';
import type { DealerTable } from './dealers/dealer.table';
import type { JobListVersionTable, JobMessageTable, JobStateCountTable, JobTable } from './jobs/job.table';
import type { MailOutboxTable } from './mail/mail-outbox.table';
import type { NotificationTable } from './notifications/notification.table';
import type { PackageTable } from './packages/package.table';
import type { KitPhotoTable, KitTable, RentalEntryTable, RentalReminderTable, RentalTable } from './rentals/rental.table';
import type { VehicleTable } from './vehicles/vehicle.table';
import type { CustomerSummaryTable, DatalogCheckTable, JobStintTable } from './reports/reports.table';
import type { InvitationTable } from './invitations/invitation.table';
import type { QueueJobTable, RateLimitCounterTable, SharedSecretTable, ThrottleHitTable, WorkProgressTable } from './shared/shared-state.table';
import type { SessionTable } from './sessions/session.table';
import type { PublicSignUpTable } from './shops/public-sign-up.table';
import type { ShopTable } from './shops/shop.table';
import type { MembershipTable, PasswordResetTable, UserTable } from './users/user.table';

export interface Database {
  shops: ShopTable;
  users: UserTable;
  memberships: MembershipTable;
  dealers: DealerTable;
  sessions: SessionTable;
  invitations: InvitationTable;
  password_resets: PasswordResetTable;
  audit_events: AuditEventTable;
  vehicles: VehicleTable;
  packages: PackageTable;
  jobs: JobTable;
  job_state_counts: JobStateCountTable;
  job_list_versions: JobListVersionTable;
  job_messages: JobMessageTable;
  notifications: NotificationTable;
  mail_outbox: MailOutboxTable;
  datalogs: DatalogTable;
  datalog_mappings: DatalogMappingTable;
  datalog_checks: DatalogCheckTable;
  job_stints: JobStintTable;
  customer_summaries: CustomerSummaryTable;
  calibration_files: CalibrationFileTable;
  shop_subscriptions: ShopSubscriptionTable;
  subscription_changes: SubscriptionChangeTable;
  subscription_invoices: SubscriptionInvoiceTable;
  stripe_events: StripeEventTable;
  payments: PaymentTable;
  payment_refunds: PaymentRefundTable;
  ledger_entries: LedgerEntryTable;
  public_sign_ups: PublicSignUpTable;
  kits: KitTable;
  kit_photos: KitPhotoTable;
  rentals: RentalTable;
  rental_entries: RentalEntryTable;
  rental_reminders: RentalReminderTable;
  shared_secrets: SharedSecretTable;
  throttle_hits: ThrottleHitTable;
  rate_limit_counters: RateLimitCounterTable;
  work_progress: WorkProgressTable;
  queue_jobs: QueueJobTable;
}
