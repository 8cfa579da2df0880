export { LabelListSchema, LabelPngQuerySchema } from '@barmkeep/schemas';
export { CultureIdParamsSchema } from '@barmkeep/schemas';
