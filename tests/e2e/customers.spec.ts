// The customers screens with customers of their own (made through the API, named with this run's tag): the list
// and its search, adding one, editing one, merging a duplicate into the customer it repeats, and the jobs a
// customer has (the duplicate's job moves over with the merge).
import type { BoardList, Customer } from '@splitscope/contract';
import { signIn } from './fixtures';
import { expect, test } from './support/own-shop';
import { fetchInPage, getJson } from './helpers';

test('customers: list, search, add, edit, merge a duplicate, their jobs', async ({ page, shop }) => {
  const tag = `c${Date.now().toString(36)}`;
  await signIn(page, shop.users.admin.email);

  // Our own data: the customer, a duplicate of them with a job on a demo board.
  const made = async (body: Record<string, unknown>) => {
    const r = await fetchInPage(page, '/customers', { method: 'POST', body: { kind: 'contractor', ...body } });
    expect(r.status).toBe(201);
    return r.body as Customer;
  };
  const keep = await made({ name: `Helga Strand ${tag}`, company: 'Fjordline Cooling', email: `helga.${tag}@fjordline.test`, phone: '555-0133' });
  const dup = await made({ name: `H. Strand ${tag}`, company: 'Fjordline Cooling' });
  const board = (await getJson<BoardList>(page, '/boards')).items[0]!;
  const job = await fetchInPage(page, '/jobs', {
    method: 'POST',
    body: { customerId: dup.id, unitDescription: 'Outdoor unit, 3.5 kW', boardId: board.id, symptom: 'Outdoor fan never starts' },
  });
  expect(job.status).toBe(201);
  const jobNumber = (job.body as { number: number }).number;

  // The list, searched by this run's tag: both, with firm, e-mail and phone beside the name.
  await page.goto('/customers');
  await page.getByLabel('Search by name, firm or e-mail').fill(tag);
  const list = page.getByRole('region', { name: 'All customers' });
  await expect(list.getByRole('link')).toHaveCount(2);
  await expect(list.getByRole('link', { name: new RegExp(`^Helga Strand ${tag}`) })).toContainText(`helga.${tag}@fjordline.test · 555-0133`);
  await page.getByLabel('Search by name, firm or e-mail').fill(`helga.${tag}@`);
  await expect(list.getByRole('link')).toHaveCount(1);

  // Add one: the form opens the new customer's page.
  const add = page.getByRole('form', { name: 'Add a customer' });
  await add.getByLabel('Name').fill(`Olu Bright ${tag}`);
  await add.getByLabel('E-mail (quotes and invoices go here)').fill(`olu.${tag}@fieldmail.test`);
  await add.getByLabel('Kind').selectOption({ label: 'Field technician' });
  await add.getByRole('button', { name: 'Add customer' }).click();
  await expect(page.getByRole('heading', { level: 1, name: `Olu Bright ${tag}` })).toBeVisible();
  await expect(page.getByText(`olu.${tag}@fieldmail.test · Field technician`)).toBeVisible();
  await expect(page.getByText('No jobs yet.')).toBeVisible();

  // Edit it: a phone number and a firm, shown once saved.
  const edit = page.getByRole('form', { name: 'Edit the customer' });
  await edit.getByLabel('Phone').fill('555-0177');
  await edit.getByLabel('Firm (if any)').fill('Bright Field Services');
  await edit.getByRole('button', { name: 'Save changes' }).click();
  await expect(page.getByText('Saved.')).toBeVisible();
  await expect(page.getByText(`Bright Field Services · olu.${tag}@fieldmail.test · 555-0177 · Field technician`)).toBeVisible();

  // The customer to keep has no job yet; the duplicate's job moves over with the merge.
  await page.goto(`/customers/${keep.id}`);
  const jobs = page.getByRole('region', { name: 'Jobs', exact: true });
  await expect(jobs.getByText('No jobs yet.')).toBeVisible();
  await page.getByLabel('Duplicate customer').selectOption({ value: dup.id });
  await page.getByRole('button', { name: `Merge H. Strand ${tag} into Helga Strand ${tag}` }).click();
  await expect(page.getByText('Merged: 1 jobs, 0 quotes and 0 invoices moved.')).toBeVisible();
  await expect(jobs.getByRole('link', { name: `Job ${jobNumber}: ${board.name}` })).toBeVisible();

  // The duplicate is gone from the list.
  await page.goto('/customers');
  await page.getByLabel('Search by name, firm or e-mail').fill(tag);
  await expect(list.getByRole('link')).toHaveCount(2);
  await expect(list.getByRole('link', { name: new RegExp(`^H\\. Strand ${tag}`) })).toHaveCount(0);
});
