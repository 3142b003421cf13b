/**
 * A shop of the spec's own: `test` here is the project's `test` (fixtures.ts) with a `shop` fixture. The first test
 * of a spec file that asks for `shop` gets a new shop from the server's test-only route (apps/server/src/testing/
 * routes.ts, docs/decisions/0009-test-shops.md), made by the factories the demo seed uses: one person per role
 * (`shop.users.tech.email`, the demo password) and the demo boards published in it (`shop.boards.outdoorFan`).
 * Every test of that file shares it; `test.beforeAll` reaches it through the worker fixture `specShop(file)`.
 * The shop is removed with everything it owns once the worker moves on to the next spec file, or at the end.
 * So nothing a spec makes (verified repairs, priors, statistics, parts, people) is seen by another spec.
 */
import type { APIRequestContext } from '@playwright/test';
import type { TestShop } from '../../../apps/server/src/testing/requests';
import { expect, test as base } from '../fixtures';

export type { TestShop };
export type Role = keyof TestShop['users'];

async function make(api: APIRequestContext): Promise<TestShop> {
  const res = await api.post('/api/testing/shops');
  expect(res.status(), `a test shop: ${await res.text()}`).toBe(201);
  return (await res.json()) as TestShop;
}

async function remove(api: APIRequestContext, shop: TestShop): Promise<void> {
  const res = await api.delete(`/api/testing/shops/${shop.id}`);
  expect(res.status(), `removing test shop ${shop.id}: ${await res.text()}`).toBe(200);
}

/** A shop that was never made (its request failed the test that asked) has nothing to remove. */
const removeOnce = (api: APIRequestContext, shop: Promise<TestShop>) =>
  shop.then(
    (s) => remove(api, s),
    () => undefined,
  );

export const test = base.extend<{ shop: TestShop }, { specShop: (file: string) => Promise<TestShop> }>({
  specShop: [
    async ({ playwright }, use, workerInfo) => {
      const baseURL = (workerInfo.project.use.baseURL as string | undefined) ?? process.env.BASE_URL ?? 'http://127.0.0.1:5180';
      const api = await playwright.request.newContext({ baseURL });
      // Spec files run one after another in a worker (fullyParallel is off): a file's shop goes when the next starts.
      let current: { file: string; shop: Promise<TestShop> } | undefined;
      await use(async (file) => {
        if (current?.file !== file) {
          if (current) await removeOnce(api, current.shop);
          current = { file, shop: make(api) };
        }
        return current.shop;
      });
      if (current) await removeOnce(api, current.shop);
      await api.dispose();
    },
    { scope: 'worker' },
  ],
  shop: async ({ specShop }, use, testInfo) => {
    await use(await specShop(testInfo.file));
  },
});

export { expect };
