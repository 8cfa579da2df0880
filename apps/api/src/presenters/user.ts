import type { UserDto } from '@barmkeep/schemas';
import type { UserRow } from '../db/schema';

type PresentableUser = Pick<
  UserRow,
  'id' | 'email' | 'name' | 'role' | 'unitSystem' | 'temperatureUnit' | 'gravityUnit' | 'timeZone' | 'createdAt'
>;

export function presentUser(u: PresentableUser): UserDto {
  return {
    id: u.id,
    email: u.email,
    name: u.name,
    role: u.role,
    unitSystem: u.unitSystem,
    temperatureUnit: u.temperatureUnit,
    gravityUnit: u.gravityUnit,
    timeZone: u.timeZone,
    createdAt: new Date(u.createdAt).toISOString(),
  };
}
