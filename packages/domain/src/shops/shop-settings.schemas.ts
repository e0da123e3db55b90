import { z } from 'zod';
import { logRequestSchema } from '../datalog/datalog.schemas';
import { defaultLogRequest, type LogRequest } from '../datalog/log-request';

/** True for an IANA time zone name the runtime knows, such as "Europe/Berlin" or "UTC". */
export function isTimeZone(name: string): boolean {
  try {
    new Intl.DateTimeFormat('en', { timeZone: name });
    return true;
  } catch {
    return false;
  }
}

/** What an owner sets for the whole shop; stored as JSON on the shop, every field with a default. */
export const shopSettingsSchema = z.object({
  /** Largest calibration or log upload, in MiB (16 MiB covers the control units we see). */
  uploadLimitMiB: z.number().int().min(1).max(256).default(16),
  /** The shop's IANA time zone: dates in its e-mails are written in it. UTC until the owner picks one. */
  timeZone: z.string().trim().refine(isTimeZone, 'Choose a time zone from the list, such as Europe/Berlin.').default('UTC'),
  /** Rental kits: days a kit travels each way, added before the start and after the due date of every booking (default 2). */
  rentalShippingDays: z.number().int().min(0).max(14).optional(),
  /** Rental kits: daily overdue reminders the customer gets before they stop; the owner is told every day (default 5). */
  rentalOverdueReminderLimit: z.number().int().min(0).max(30).optional(),
  /** Keep a new job on hold until its package is paid. */
  holdUntilPaid: z.boolean().default(false),
  /** Default log requests by engine family (free text such as "v8" or "2.0 turbo i4"), matched case-insensitively. */
  logRequestDefaults: z.record(z.string().trim().min(1).max(80), logRequestSchema).default({}),
  /**
   * Log-check thresholds the shop may tune; anything left out uses DEFAULT_ANALYSIS_SETTINGS, whose sources are
   * given there (warm coolant 80 °C and pedal on the floor at 95 % are common practice [CP]).
   */
  analysis: z
    .object({
      warmCoolantC: z.number().min(50).max(110),
      wotThresholdPct: z.number().min(50).max(100),
      partialPedalPct: z.number().min(10).max(90),
      trimRpmBinWidth: z.number().int().min(100).max(2000),
      trimMapBinWidthKpa: z.number().min(2).max(50),
      trimMafBinWidthGs: z.number().min(1).max(50),
      bankSplitPct: z.number().min(1).max(30),
      trimMinSamples: z.number().int().min(1).max(1000),
      wotRpmBinWidth: z.number().int().min(100).max(2000),
    })
    .partial()
    .default({}),
});
export type ShopSettings = z.infer<typeof shopSettingsSchema>;

export const shopSettingsPatchSchema = shopSettingsSchema.partial();

/** Parses stored settings, filling defaults, so an older row never breaks a newer app. */
export function parseShopSettings(json: string): ShopSettings {
  let raw: unknown;
  try {
    raw = JSON.parse(json);
  } catch {
    raw = {};
  }
  const parsed = shopSettingsSchema.safeParse(raw);
  return parsed.success ? parsed.data : shopSettingsSchema.parse({});
}

const familyKey = (family: string) => family.toLowerCase().replace(/[^a-z0-9]/g, '');

/** The shop's own default for this engine family, else the built-in one for the round. */
export function logRequestFor(settings: ShopSettings, engineFamily: string, round = 1): LogRequest {
  const key = familyKey(engineFamily);
  const own = Object.entries(settings.logRequestDefaults).find(([family]) => familyKey(family) === key)?.[1];
  return own ?? defaultLogRequest(engineFamily, round);
}
