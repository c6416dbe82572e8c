import type { UserEntity } from '@server/entities/user.entity.ts';
import type { ServiceContext } from '@server/services/context.ts';

/** A service context whose actor is known (every entry operation is done by a signed-in person). */
export type ActingContext = ServiceContext & { actor: UserEntity };
