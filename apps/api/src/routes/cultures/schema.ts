export {
  makeCultureCreateSchema,
  CultureUpdateSchema,
  CultureListSchema,
  CultureIdParamsSchema,
  CultureEventCreateSchema,
  CultureStateChangeSchema,
  CultureSplitSchema,
  CultureQuarantineSchema,
  CultureHealthQuerySchema,
  CulturePhotoUploadSchema,
  CultureBackupExportQuerySchema,
  backupLimits,
  type CultureListQuery,
} from '@barmkeep/schemas';
import { z } from 'zod';

export const CulturePhotoParamsSchema = z.object({
  id: z.string().min(1).max(64),
  photoId: z.string().min(1).max(64),
  variant: z.enum(['web', 'thumb']),
});
