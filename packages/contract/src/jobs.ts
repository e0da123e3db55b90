import { logRequestSchema } from '@revloop/domain/datalog';
import { JOB_STATES, NEXT_STEP_ACTIONS, specialRequestsSchema, type AvailableTransition } from '@revloop/domain/jobs';
import { z } from 'zod';
import { itemOf, joinedRefSchema, listOf, listWithMeta, personRefSchema, timestamp } from './envelope';

/** Sort keys of `GET /api/jobs` and its CSV export (the repository orders by each; the API test checks they agree). */
export const JOB_SORT_KEYS = ['number', 'created', 'updated', 'state_changed', 'state', 'customer', 'vehicle', 'round'] as const;
export type JobSortKey = (typeof JOB_SORT_KEYS)[number];

const stateList = z
  .string()
  .transform((s) => s.split(',').filter(Boolean))
  .pipe(z.array(z.enum(JOB_STATES)));

/** Query string of `GET /api/jobs` and `GET /api/jobs/export.csv`. */
export const jobListQuerySchema = z.object({
  state: stateList.optional(),
  open: z.enum(['true', 'false']).optional(),
  tuner: z.string().min(1).optional(),
  dealer: z.string().min(1).optional(),
  package: z.string().min(1).optional(),
  customer: z.string().min(1).optional(),
  q: z.string().trim().max(100).optional(),
  mine: z.enum(['true', 'false']).optional(),
  /** Only jobs with a revision draft waiting for a second person's approval (staff; nobody else sees drafts). */
  awaiting: z.enum(['approval']).optional(),
  sort: z.enum(JOB_SORT_KEYS).default('updated'),
  dir: z.enum(['asc', 'desc']).default('desc'),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(50),
});
export type JobListQuery = z.infer<typeof jobListQuerySchema>;

export const jobSchema = z.object({
  id: z.string(),
  number: z.number(),
  state: z.enum(JOB_STATES),
  stateLabel: z.string(),
  heldFrom: z.enum(JOB_STATES).nullable(),
  round: z.number(),
  vehicle: z.object({ id: z.string(), description: z.string(), vin: z.string(), modelYear: z.number() }),
  customer: z.object({ id: z.string(), name: z.string(), email: z.string() }),
  dealer: joinedRefSchema.nullable(),
  package: personRefSchema,
  tuner: joinedRefSchema.nullable(),
  goals: z.string(),
  specialRequests: specialRequestsSchema,
  logRequest: logRequestSchema,
  facts: z.object({ hasStockRead: z.boolean(), hasRevisionForRound: z.boolean(), hasLogForRound: z.boolean() }),
  /** Revision drafts of the coming round waiting for approval; always 0 for the customer side, which sees no draft. */
  draftsAwaitingApproval: z.number(),
  stateChangedAt: timestamp,
  hoursInState: z.number(),
  stale: z.boolean(),
  nextStep: z.string(),
  /** What the page offers beside the next step: `pay` opens the job's checkout (a customer's sent revision waits, locked until paid); null for nothing. */
  nextStepAction: z.enum(NEXT_STEP_ACTIONS).nullable(),
  // The state machine computes the moves; the contract only carries them.
  transitions: z.array(z.custom<AvailableTransition>()),
  createdAt: timestamp,
  updatedAt: timestamp,
});
export type Job = z.infer<typeof jobSchema>;
export type SpecialRequests = Job['specialRequests'];

export const jobListResponseSchema = listWithMeta(jobSchema, z.object({ total: z.number(), page: z.number(), pageSize: z.number(), pageCount: z.number() }));
export type JobListResponse = z.infer<typeof jobListResponseSchema>;

/** Body of `POST /api/jobs/:id/transitions`: the target state; Send revision also takes the "what changed" note. */
export const SEND_NOTE_MAX = 2000;
export const jobTransitionInputSchema = z.object({
  to: z.enum(JOB_STATES),
  kitOutOverride: z.boolean().optional(),
  note: z.string().trim().min(1, 'Say what changed in this revision.').max(SEND_NOTE_MAX, `Keep the note under ${SEND_NOTE_MAX} characters.`).optional(),
});
export type JobTransitionInput = z.input<typeof jobTransitionInputSchema>;

export const timelineEntrySchema = z.object({ id: z.string(), at: timestamp, action: z.string(), actor: z.string().nullable(), text: z.string() });
export type TimelineEntry = z.infer<typeof timelineEntrySchema>;

export const jobDetailSchema = jobSchema.extend({ timeline: z.array(timelineEntrySchema) });
export type JobDetail = z.infer<typeof jobDetailSchema>;
export const jobDetailResponseSchema = itemOf(jobDetailSchema);

export const jobMessageSchema = z.object({ id: z.string(), body: z.string(), author: personRefSchema, mine: z.boolean(), createdAt: timestamp });
export type JobMessage = z.infer<typeof jobMessageSchema>;
export const jobMessagesResponseSchema = listOf(jobMessageSchema);
