import { z } from 'zod';

export const CUSTOMER_SORT_KEYS = ['name', 'email', 'open_jobs', 'last_activity', 'paid'] as const;
export type CustomerSortKey = (typeof CUSTOMER_SORT_KEYS)[number];

/** `GET /api/customers` query: search, sort and paging are done by the server. */
export const customerListQuerySchema = z.object({
  q: z.string().trim().max(100).optional(),
  sort: z.enum(CUSTOMER_SORT_KEYS).default('name'),
  dir: z.enum(['asc', 'desc']).default('asc'),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(500).default(25),
});
export type CustomerListQuery = z.input<typeof customerListQuerySchema>;

const ref = z.object({ id: z.string(), name: z.string() });

/** Who the customer is: the part the list and the customer page share. */
const customerSchema = z.object({
  id: z.string(),
  name: z.string(),
  email: z.string(),
  status: z.enum(['active', 'deactivated']),
  dealer: ref.nullable(),
  since: z.string(),
});

/** One row of the customer list. */
export const customerListItemSchema = customerSchema.extend({
  vehicleCount: z.number().int(),
  /** Up to three vehicle descriptions joined by " · ". */
  vehicles: z.string().nullable(),
  openJobs: z.number().int(),
  jobCount: z.number().int(),
  lastActivityAt: z.string(),
  /** Paid for the customer's jobs less refunds, in the shop currency's minor units. */
  paidMinor: z.number().int(),
  currency: z.string(),
});
export type CustomerListItem = z.infer<typeof customerListItemSchema>;

export const customerListResponseSchema = z.object({
  data: z.array(customerListItemSchema),
  meta: z.object({ total: z.number().int(), page: z.number().int(), pageSize: z.number().int(), pageCount: z.number().int() }),
});
export type CustomerListResponse = z.infer<typeof customerListResponseSchema>;

/** `GET /api/customers/:id`: the customer with payments and the latest messages (jobs come from `GET /api/jobs?customer=`). */
export const customerDetailSchema = customerSchema.extend({
  currency: z.string(),
  paidMinor: z.number().int(),
  vehicles: z.array(z.object({ id: z.string(), vin: z.string(), modelYear: z.number().int(), description: z.string(), engineFamily: z.string() })),
  payments: z.array(
    z.object({
      id: z.string(),
      jobId: z.string(),
      jobNumber: z.number().int(),
      amountMinor: z.number().int(),
      refundedMinor: z.number().int(),
      currency: z.string(),
      status: z.enum(['open', 'paid', 'expired']),
      createdAt: z.string(),
      paidAt: z.string().nullable(),
    }),
  ),
  messages: z.array(
    z.object({ id: z.string(), jobId: z.string(), jobNumber: z.number().int(), author: ref, body: z.string(), createdAt: z.string() }),
  ),
});
export type CustomerDetail = z.infer<typeof customerDetailSchema>;
