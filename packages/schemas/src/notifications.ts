import { z } from 'zod';

/** What a notice is about. Rules add their kind here; other features (club requests) use theirs. */
export const NOTIFICATION_KINDS = [
  'culture.viability',
  'culture.storage',
  'culture.best_by',
  'culture.generation',
  'plan.step',
  'club.request',
  'culture.lineage_contamination',
] as const;
export type NotificationKind = (typeof NOTIFICATION_KINDS)[number];

export const NOTIFICATION_KIND_LABELS: Record<NotificationKind, string> = {
  'culture.viability': 'Viability falling below your threshold',
  'culture.storage': 'Storage time running out',
  'culture.best_by': 'Best-by date of bought yeast',
  'culture.generation': 'Generation limit reached',
  'plan.step': 'Starter steps and brew days',
  'club.request': 'Club requests waiting for you',
  'culture.lineage_contamination': 'Contamination found in the lineage of a culture you keep',
};

export const EMAIL_DELIVERIES = ['each', 'digest', 'none'] as const;
export type EmailDelivery = (typeof EMAIL_DELIVERIES)[number];

/**
 * Defaults when a person has changed nothing, with their source:
 * - viabilityThresholdPct 50: below half alive a pitch needs a starter [CP]; projection from core `projectViability`.
 * - warnDays 7: a week leaves time to plan a starter [CP].
 * - generationLimit 10: core `generationAdvice`, warn after 5 and re-culture after 10 [CP].
 * - stepLeadHours 12: a morning notice for an evening step [product default].
 * - digestHour 7: 07:00 in the person's time zone [product default].
 */
export const REMINDER_DEFAULTS = {
  emailDelivery: 'each' as EmailDelivery,
  digestHour: 7,
  viabilityThresholdPct: 50,
  warnDays: 7,
  generationLimit: 10,
  stepLeadHours: 12,
  mutedKinds: [] as NotificationKind[],
} as const;

export const reminderLimits = {
  thresholdMinPct: 5,
  thresholdMaxPct: 95,
  warnDaysMax: 60,
  generationLimitMax: 200,
  stepLeadHoursMax: 168,
  listMax: 100,
} as const;

const wholeNumber = (what: string, min: number, max: number) =>
  z
    .number({ error: `Enter ${what} as a whole number` })
    .int(`Enter ${what} as a whole number`)
    .min(min, `${what[0]!.toUpperCase()}${what.slice(1)} must be at least ${min}`)
    .max(max, `${what[0]!.toUpperCase()}${what.slice(1)} must be at most ${max}`);

/** Every reminder setting, as the account page's form holds them. */
export const NotificationPreferencesFormSchema = z.object({
  emailDelivery: z.enum(EMAIL_DELIVERIES, { error: 'Choose how to receive e-mail' }),
  digestHour: wholeNumber('the digest hour', 0, 23),
  viabilityThresholdPct: wholeNumber(
    'the viability threshold',
    reminderLimits.thresholdMinPct,
    reminderLimits.thresholdMaxPct,
  ),
  warnDays: wholeNumber('the days of warning', 0, reminderLimits.warnDaysMax),
  generationLimit: wholeNumber('the generation limit', 1, reminderLimits.generationLimitMax),
  stepLeadHours: wholeNumber('the hours before a step', 0, reminderLimits.stepLeadHoursMax),
  mutedKinds: z
    .array(z.enum(NOTIFICATION_KINDS))
    .max(NOTIFICATION_KINDS.length)
    .transform((k) => [...new Set(k)]),
});
export type NotificationPreferencesFormInput = z.input<typeof NotificationPreferencesFormSchema>;

export const NotificationPreferencesUpdateSchema = NotificationPreferencesFormSchema.partial()
  .strict()
  .refine((v) => Object.keys(v).length > 0, 'Nothing to change');
export type NotificationPreferencesUpdateInput = z.input<typeof NotificationPreferencesUpdateSchema>;

/** What the e-mail preferences page (reached by the secret link, signed out) may change. */
export const EmailPreferencesUpdateSchema = z.object({
  emailDelivery: z.enum(EMAIL_DELIVERIES, { error: 'Choose how to receive e-mail' }),
});
export type EmailPreferencesUpdateInput = z.input<typeof EmailPreferencesUpdateSchema>;

export const EmailTokenParamsSchema = z.object({ token: z.string().min(20).max(100) });

export const NotificationListSchema = z.object({
  unread: z
    .enum(['true', 'false'])
    .optional()
    .transform((v) => v === 'true'),
  before: z.iso.datetime({ offset: true }).optional(),
  limit: z.coerce.number().int().min(1).max(reminderLimits.listMax).default(30),
});

export const NotificationIdParamsSchema = z.object({ id: z.string().min(1).max(64) });

export interface NotificationDto {
  id: string;
  kind: string;
  subjectId: string;
  title: string;
  body: string;
  link: string;
  dueAt: string | null;
  createdAt: string;
  readAt: string | null;
}

export interface NotificationListDto {
  notifications: NotificationDto[];
  unreadCount: number;
}

export interface NotificationPreferencesDto {
  emailDelivery: EmailDelivery;
  digestHour: number;
  viabilityThresholdPct: number;
  warnDays: number;
  generationLimit: number;
  stepLeadHours: number;
  mutedKinds: NotificationKind[];
  timeZone: string;
}

export interface EmailPreferencesDto {
  /** the address, partly hidden: the page is reachable without signing in */
  emailHint: string;
  emailDelivery: EmailDelivery;
}

export interface CalendarFeedDto {
  /** a feed is live */
  active: boolean;
  createdAt: string | null;
  lastUsedAt: string | null;
  /** only in the reply that made the address; afterwards only its existence is known */
  url?: string;
}

// ---------------------------------------------------------------- labels

export const LABEL_LAYOUTS = ['sheet', 'single'] as const;
export type LabelLayout = (typeof LABEL_LAYOUTS)[number];

export const LabelListSchema = z.object({
  ids: z
    .union([z.string(), z.array(z.string())])
    .transform((v) => (Array.isArray(v) ? v : v.split(',')).map((s) => s.trim()).filter(Boolean))
    .pipe(
      z.array(z.string().min(1).max(64)).min(1, 'Choose at least one culture').max(60, 'At most 60 labels at once'),
    ),
});

export const LabelPngQuerySchema = z.object({
  size: z.enum(['small', 'large']).default('small'),
});

export interface LabelDto {
  cultureId: string;
  /** short code printed on the jar, also the end of the culture's id */
  code: string;
  strainName: string;
  generation: number;
  form: string;
  /** the made / harvested date, YYYY-MM-DD in the keeper's time zone */
  date: string;
  storage: string;
  /** what the QR code opens */
  url: string;
  /** the QR code as an SVG document */
  qrSvg: string;
}
