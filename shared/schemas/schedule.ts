import * as z from 'zod';

/** One interval of a recall schedule: target day after surgery and its tolerance window. */
export const recallIntervalSchema = z.object({
  key: z.string().trim().regex(/^[a-z0-9-]{1,20}$/, 'Use 1–20 lower-case letters, digits or hyphens (e.g. 6m).'),
  label: z.string().trim().min(1, 'Enter a label.').max(40),
  targetDays: z.number().int().min(1, 'At least 1 day.').max(3650),
  windowBeforeDays: z.number().int().min(0).max(365),
  windowAfterDays: z.number().int().min(0).max(365),
});

/** `POST /api/schedules` and `PATCH /api/schedules/:id` (with version). */
export const scheduleCreateSchema = z.object({
  name: z.string().trim().min(1, 'Enter a name.').max(80),
  intervals: z
    .array(recallIntervalSchema)
    .min(1, 'Add at least one interval.')
    .max(20)
    .refine((intervals) => new Set(intervals.map((interval) => interval.key)).size === intervals.length, 'Interval keys must be unique.')
    .refine((intervals) => intervals.every((interval, index) => index === 0 || interval.targetDays > intervals[index - 1].targetDays), 'List intervals in increasing order of days.'),
});
export type ScheduleCreateRequest = z.input<typeof scheduleCreateSchema>;

export const scheduleUpdateSchema = scheduleCreateSchema.partial().extend({ version: z.number().int().min(1) });
export type ScheduleUpdateRequest = z.input<typeof scheduleUpdateSchema>;

/** A schedule as the API returns it. */
export interface ScheduleView {
  id: number;
  name: string;
  intervals: z.infer<typeof recallIntervalSchema>[];
  isDefault: boolean;
  version: number;
}
