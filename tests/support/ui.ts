import type { Page } from 'playwright-core';
import type { Role } from '../../shared/schemas/roles';
import { createAccount } from '../../server/services/accounts';
import type { ServiceDeps } from '../../server/services/deps';
import { createLab } from '../../server/services/labs';
import { addMember } from '../../server/services/members';
import { PASSWORD, uniqueEmail } from './accounts';

/** A lab with one person per role, made through the app's own services. */
export async function seedLab(deps: ServiceDeps, name = 'Seeded lab') {
  const people = {} as Record<Role, { email: string; name: string }>;
  const lead = await createAccount(deps, {
    email: uniqueEmail('manager'),
    displayName: 'Lead Person',
    password: PASSWORD,
  });
  const lab = await createLab({ name, creatorId: lead.id });
  people.manager = { email: lead.email, name: lead.displayName };
  for (const role of ['technician', 'reviewer', 'viewer'] as const) {
    const user = await createAccount(deps, {
      email: uniqueEmail(role),
      displayName: `The ${role}`,
      password: PASSWORD,
    });
    await addMember(lab.id, user.id, role);
    people[role] = { email: user.email, name: user.displayName };
  }
  return { labId: lab.id, people };
}

/** Signs in through the sign-in screen the way a person does. */
export async function signInThroughUi(
  page: Page,
  baseUrl: string,
  email: string,
  password = PASSWORD,
  path = '/',
) {
  await page.goto(`${baseUrl}${path}`);
  await page.getByTestId('field-email').fill(email);
  await page.getByTestId('field-password').fill(password);
  await page.getByTestId('sign-in-submit').click();
}
