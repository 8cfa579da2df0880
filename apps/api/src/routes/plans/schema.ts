export {
  makePlanCreateSchema,
  PlanIdParamsSchema,
  PlanStepParamsSchema,
  PlanStepCompleteSchema,
  PlanStatusSchema,
} from '@barmkeep/schemas';
