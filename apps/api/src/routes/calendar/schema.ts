import { z } from 'zod';

/** `/api/calendar/<secret>.ics` */
export const CalendarFileParamsSchema = z.object({
  file: z
    .string()
    .regex(/^[\w-]{20,100}\.ics$/, 'Not a calendar address')
    .transform((f) => f.slice(0, -4)),
});
