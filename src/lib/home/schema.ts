import { z } from 'zod';

/** What the home page shows; one shape for every role, with the parts each role sees filled in. */
export const DueSpecimenSchema = z.object({
	id: z.string(),
	objectNumber: z.string(),
	title: z.string(),
	nextCheckDue: z.string(),
	location: z.string().nullable(),
});

export const HomeSummarySchema = z.object({
	role: z.enum(['conservator', 'reviewer', 'curator', 'admin']),
	collection: z
		.object({
			specimens: z.number(),
			overdue: z.number(),
			dueIn90Days: z.number(),
			withHazards: z.number(),
			byHazard: z.record(z.string(), z.number()),
			byPreservative: z.record(z.string(), z.number()),
			bySeal: z.record(z.string(), z.number()),
			mostOverdue: z.array(DueSpecimenSchema),
		})
		.nullable(),
	openChecks: z.number().nullable(),
	awaitingReview: z.number().nullable(),
	admin: z
		.object({
			usersByRole: z.record(z.string(), z.number()),
			pendingInvitations: z.number(),
			disabledUsers: z.number(),
			mailQueued: z.number(),
			mailFailed: z.number(),
		})
		.nullable(),
});
export type HomeSummary = z.infer<typeof HomeSummarySchema>;
