export { EquipmentUpdateSchema } from '@barmkeep/schemas';
