import { z } from 'zod';

export const DevMailShowSchema = z.object({ id: z.uuid({ message: 'Not a message id' }) });
