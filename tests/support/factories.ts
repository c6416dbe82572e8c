import type { DataSource } from 'typeorm';
import type { NotebookRole, SiteRole } from '@shared/domain/roles.ts';
import type { NotebookEntity } from '@server/entities/notebook.entity.ts';
import type { UserEntity } from '@server/entities/user.entity.ts';
import { addMember } from '@server/services/members/add-member.ts';
import { createNotebook } from '@server/services/notebooks/create-notebook.ts';
import { createUser } from '@server/services/users/create-user.ts';

/**
 * Fresh people and notebooks, written through the services (so with their audit events).
 * No test-runner imports: the HTTP load benchmark uses them too.
 */

let counter = 0;
export const uniqueEmail = (label: string) => `${label}.${Date.now().toString(36)}${(counter++).toString(36)}@test.example`;

export interface TestPerson {
  user: UserEntity;
  email: string;
  password: string;
}

/** A new account with a known password. */
export async function makeUser(dataSource: DataSource, props: { label?: string; siteRole?: SiteRole } = {}): Promise<TestPerson> {
  const email = uniqueEmail(props.label ?? 'person');
  const password = `pw-${email}`;
  const user = await dataSource.transaction((manager) =>
    createUser({ actor: null, manager }, { email, name: `Test ${props.label ?? 'person'}`, password, siteRole: props.siteRole ?? 'member', via: 'test' }),
  );
  return { user, email, password };
}

/** A notebook whose PI is `pi`, with the other members added. */
export async function makeNotebook(
  dataSource: DataSource,
  pi: UserEntity,
  members: { user: UserEntity; role: NotebookRole }[] = [],
): Promise<NotebookEntity> {
  return dataSource.transaction(async (manager) => {
    const { notebook } = await createNotebook({ actor: pi, manager }, { title: `Test notebook ${uniqueEmail('nb')}`, description: '' });
    for (const m of members) await addMember({ actor: pi, manager }, { notebookId: notebook.id, email: m.user.email, role: m.role });
    return notebook;
  });
}
