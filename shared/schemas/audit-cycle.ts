import * as z from 'zod';
import { isoDate, note } from './clinical-fields';

/**
 * Audit cycle stages, our own names for prepare → measure → analyse → present → close
 * (NICE/CHI, Principles for Best Practice in Clinical Audit, 2002).
 */
export const CYCLE_STATES = ['scoping', 'gathering', 'weighing', 'reported', 'closed'] as const;
export type CycleState = (typeof CYCLE_STATES)[number];
export const CYCLE_STATE_LABELS: Readonly<Record<CycleState, string>> = {
  scoping: 'Scoping',
  gathering: 'Gathering data',
  weighing: 'Weighing results',
  reported: 'Reported',
  closed: 'Closed',
};
/** Forward moves only; `weighing → reported` freezes the results. */
export const CYCLE_STATE_NEXT: Readonly<Record<CycleState, readonly CycleState[]>> = {
  scoping: ['gathering'],
  gathering: ['weighing'],
  weighing: ['gathering', 'reported'],
  reported: ['closed'],
  closed: [],
};

/** `POST /api/audits/:id/cycles`. */
export const cycleCreateSchema = z
  .object({
    periodStart: isoDate,
    periodEnd: isoDate,
    notes: note(2000).default(''),
  })
  .refine((cycle) => cycle.periodStart <= cycle.periodEnd, { message: 'The period ends before it starts.', path: ['periodEnd'] });
export type CycleCreateRequest = z.input<typeof cycleCreateSchema>;

/** `PATCH /api/cycles/:id`. Moving to `reported` freezes a snapshot of every result. */
export const cycleUpdateSchema = z.object({
  state: z.enum(CYCLE_STATES).optional(),
  periodStart: isoDate.optional(),
  periodEnd: isoDate.optional(),
  presentedDate: isoDate.nullable().optional(),
  notes: note(2000).optional(),
  version: z.number().int().min(1),
});
export type CycleUpdateRequest = z.input<typeof cycleUpdateSchema>;

export const ACTION_STATES = ['open', 'under-way', 'done', 'dropped'] as const;
export type ActionState = (typeof ACTION_STATES)[number];
export const ACTION_STATE_LABELS: Readonly<Record<ActionState, string>> = { open: 'Open', 'under-way': 'Under way', done: 'Done', dropped: 'Dropped' };

/** `POST /api/cycles/:id/actions`. */
export const actionItemCreateSchema = z.object({
  action: z.string().trim().min(3, 'Describe the action.').max(1000),
  ownerId: z.number().int().positive('Choose who owns it.'),
  dueDate: isoDate,
  state: z.enum(ACTION_STATES).default('open'),
});
export type ActionItemCreateRequest = z.input<typeof actionItemCreateSchema>;

/** `PATCH /api/actions/:id`. */
export const actionItemUpdateSchema = z.object({
  action: z.string().trim().min(3).max(1000).optional(),
  ownerId: z.number().int().positive().optional(),
  dueDate: isoDate.optional(),
  state: z.enum(ACTION_STATES).optional(),
  version: z.number().int().min(1),
});
export type ActionItemUpdateRequest = z.input<typeof actionItemUpdateSchema>;

/** `POST /api/audits/:id/notes`: a partner's or lead's comment on a result. */
export const reviewNoteCreateSchema = z.object({
  cycleId: z.number().int().positive().nullable().default(null),
  /** What the note is about, e.g. `standard:3`, `chart:funnel`, `chart:drift`. */
  topic: z.string().trim().regex(/^[a-z-]+(:[a-z0-9-]+)?$/, 'Unknown topic.').max(60),
  text: z.string().trim().min(1, 'Write the note.').max(2000),
});
export type ReviewNoteCreateRequest = z.input<typeof reviewNoteCreateSchema>;

export interface CycleView {
  id: number;
  auditId: number;
  number: number;
  periodStart: string;
  periodEnd: string;
  state: CycleState;
  frozenAt: string | null;
  presentedDate: string | null;
  notes: string;
  version: number;
  actions: ActionItemView[];
}

export interface ActionItemView {
  id: number;
  cycleId: number;
  action: string;
  owner: { id: number; displayName: string };
  dueDate: string;
  state: ActionState;
  version: number;
}

export interface ReviewNoteView {
  id: number;
  auditId: number;
  cycleId: number | null;
  topic: string;
  text: string;
  author: { id: number; displayName: string };
  createdAt: string;
}
