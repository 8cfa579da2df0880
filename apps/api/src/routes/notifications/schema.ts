export {
  NotificationListSchema,
  NotificationIdParamsSchema,
  NotificationPreferencesUpdateSchema,
  EmailPreferencesUpdateSchema,
  EmailTokenParamsSchema,
} from '@barmkeep/schemas';
