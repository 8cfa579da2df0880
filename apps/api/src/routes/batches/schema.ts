export {
  makeBatchCreateSchema,
  BatchUpdateSchema,
  BatchIdParamsSchema,
  BatchHarvestSchema,
  GenerationChartQuerySchema,
} from '@barmkeep/schemas';
