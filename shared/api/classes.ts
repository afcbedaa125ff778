/** Classes, enrolment and rosters: request and response bodies. */
import { z } from 'zod';
import { EmailSchema, PersonNameSchema } from './auth';

export const ClassSummarySchema = z.object({
  id: z.string(),
  name: z.string(),
  term: z.string(),
  instructorId: z.string(),
  /** Only for the class's instructor and admins. */
  joinCode: z.string().nullable(),
  studentCount: z.number().int().nullable(),
  demo: z.boolean(),
  createdAt: z.string(),
});
export type ClassSummary = z.infer<typeof ClassSummarySchema>;

export const ClassListSchema = z.object({ classes: z.array(ClassSummarySchema) });

export const CreateClassRequestSchema = z.object({
  name: z.string().trim().min(1, 'a class needs a name').max(120, 'a class name is at most 120 characters'),
  term: z.string().trim().min(1, 'say which term, e.g. "Fall 2026"').max(60, 'a term is at most 60 characters'),
});
export type CreateClassRequest = z.infer<typeof CreateClassRequestSchema>;

export const JoinClassRequestSchema = z.object({ joinCode: z.string() });

export const StudentEntrySchema = z.object({ id: z.string(), email: z.string(), name: z.string(), enrolledAt: z.string() });
export const StudentListSchema = z.object({ students: z.array(StudentEntrySchema) });

/** One roster row's fate; `line` is the CSV line number (the header is line 1). */
export const RosterRowResultSchema = z.object({ line: z.number().int(), email: z.string(), name: z.string(), reason: z.string().optional() });

/**
 * The roster upload report: `invited` = an invitation e-mail went out (whether or not the address
 * has an account: nobody is enrolled until they accept, and the report never says what kind of
 * account an address has), `already` = enrolled or invited before, `rejected` with the reason.
 */
export const RosterReportSchema = z.object({
  invited: z.array(RosterRowResultSchema),
  already: z.array(RosterRowResultSchema),
  rejected: z.array(RosterRowResultSchema),
});
export type RosterReport = z.infer<typeof RosterReportSchema>;

export const PendingInvitationSchema = z.object({ id: z.string(), email: z.string(), name: z.string().nullable(), expiresAt: z.string(), usedAt: z.string().nullable() });
/** A class's invitations, newest first: accepted and expired ones too, cancelled ones not. */
export const InvitationListSchema = z.object({ invitations: z.array(PendingInvitationSchema) });

/** Invite one student by hand; an open invitation to the same address is replaced (sent again). */
export const InviteStudentRequestSchema = z.object({ email: EmailSchema, name: PersonNameSchema });
export type InviteStudentRequest = z.infer<typeof InviteStudentRequestSchema>;

export const ClassInvitationSentSchema = z.object({ email: z.string(), name: z.string().nullable(), expiresAt: z.string() });
export type ClassInvitationSent = z.infer<typeof ClassInvitationSentSchema>;
