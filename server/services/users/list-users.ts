import type { EntityManager } from 'typeorm';
import { UserEntity } from '@server/entities/user.entity.ts';

export const listUsers = (manager: EntityManager): Promise<UserEntity[]> => manager.find(UserEntity, { order: { name: 'ASC' } });
