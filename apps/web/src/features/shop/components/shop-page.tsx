import { Link } from 'react-router-dom';
import { useState, type FormEvent } from 'react';
import { GENERIC_METER_LABEL, meterProfileIds, meterProfileLabels, updateShopRequest, type Shop } from '@splitscope/contract';
import { Button } from '@/components/ui/button';
import { PageHeader } from '@/components/ui/page-header';
import { QueryState } from '@/components/ui/query-state';
import { ErrorNote, TextField } from '@/components/ui/text-field';
import { useShop } from '../api/get-shop';
import { useUpdateShop } from '../api/update-shop';
import { uploadLogo } from '../api/upload-logo';
import { DutyRulesSection } from './duty-rules';

function ShopForm({ shop }: { shop: Shop }) {
  const update = useUpdateShop();
  const [f, setF] = useState({
    name: shop.name,
    address: shop.address ?? '',
    phone: shop.phone ?? '',
    email: shop.email ?? '',
    taxNumber: shop.taxNumber ?? '',
    sessionIdleHours: String(shop.sessionIdleHours),
    sessionMaxDays: String(shop.sessionMaxDays),
    meterProfile: shop.meterProfile ?? '',
  });
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [logoError, setLogoError] = useState<string | null>(null);
  const bind = (k: keyof typeof f) => ({ value: f[k], onChange: (e: { target: { value: string } }) => setF({ ...f, [k]: e.target.value }), error: errors[k] });
  const submit = (e: FormEvent) => {
    e.preventDefault();
    const r = updateShopRequest.safeParse({
      ...f,
      sessionIdleHours: Number(f.sessionIdleHours),
      sessionMaxDays: Number(f.sessionMaxDays),
      meterProfile: f.meterProfile || null,
    });
    if (!r.success) return setErrors(Object.fromEntries(r.error.issues.map((i) => [i.path.join('.'), i.message])));
    setErrors({});
    update.mutate(r.data);
  };
  const setLogo = async (file: File | undefined) => {
    if (!file) return;
    setLogoError(null);
    try {
      const up = await uploadLogo(file);
      await update.mutateAsync({ logoUploadId: up.id });
    } catch (err) {
      setLogoError((err as Error).message);
    }
  };
  return (
    <div className="space-y-6">
      <form onSubmit={submit} noValidate className="grid gap-4 rounded-lg border border-stone-300 bg-white p-4 sm:grid-cols-2">
        <h2 className="text-lg font-semibold sm:col-span-2">What customers see</h2>
        <p className="-mt-3 text-sm text-stone-700 sm:col-span-2">
          On repair reports, quote and invoice e-mails (which come from the shop's name) and the customer page.
        </p>
        <TextField label="Shop name" {...bind('name')} className="sm:col-span-2" />
        <TextField label="Address" {...bind('address')} className="sm:col-span-2" />
        <TextField label="Phone" type="tel" {...bind('phone')} />
        <TextField label="Shop e-mail" type="email" {...bind('email')} />
        <TextField label="Tax number" {...bind('taxNumber')} />
        <h2 className="mt-2 text-lg font-semibold sm:col-span-2">Sessions</h2>
        <TextField label="Sign out after this many hours without use" type="number" min={1} max={168} {...bind('sessionIdleHours')} />
        <TextField label="Sign out after this many days at most" type="number" min={1} max={90} {...bind('sessionMaxDays')} />
        <h2 className="mt-2 text-lg font-semibold sm:col-span-2">Meter</h2>
        <label className="block sm:col-span-2">
          <span className="text-sm font-medium">The meter jobs are read with unless a job names another</span>
          <select
            className="mt-1 block min-h-11 w-full rounded-md border border-stone-500 bg-white px-3"
            value={f.meterProfile}
            onChange={(e) => setF({ ...f, meterProfile: e.target.value })}
          >
            <option value="">{GENERIC_METER_LABEL}</option>
            {meterProfileIds.map((id) => (
              <option key={id} value={id}>
                {meterProfileLabels[id]}
              </option>
            ))}
          </select>
          <span className="text-sm text-stone-700">Expected values and their bands are computed with this meter's test currents and accuracy.</span>
        </label>
        <div className="sm:col-span-2" aria-live="polite">
          <ErrorNote error={update.error} />
          {update.isSuccess && <p className="text-sm font-semibold text-ok">Saved.</p>}
        </div>
        <Button type="submit" disabled={update.isPending} className="sm:col-span-2 sm:justify-self-start">
          {update.isPending ? 'Saving…' : 'Save'}
        </Button>
      </form>
      <section className="space-y-2 rounded-lg border border-stone-300 bg-white p-4">
        <h2 className="text-lg font-semibold">Logo</h2>
        <p className="text-sm text-stone-700">It heads the repair report and the customer page; a large picture is scaled down to fit.</p>
        {shop.logoUploadId ? (
          <img src={`/api/uploads/${shop.logoUploadId}`} alt={`${shop.name} logo`} className="max-h-24 max-w-60 object-contain" />
        ) : (
          <p className="text-stone-700">No logo yet.</p>
        )}
        <label className="block">
          <span className="text-sm font-medium">Choose a PNG or JPEG</span>
          <input type="file" accept="image/png,image/jpeg" className="mt-1 block min-h-11" onChange={(e) => void setLogo(e.target.files?.[0])} />
        </label>
        {logoError && (
          <p role="alert" className="text-sm text-high">
            {logoError}
          </p>
        )}
      </section>
    </div>
  );
}

/** The admin's shop details: name, address, phone, e-mail, tax number, logo, session lifetime, duty rules. */
export default function ShopPage() {
  const shop = useShop();
  return (
    <div className="max-w-3xl">
      <PageHeader title="Shop">
        <Link className="inline-flex min-h-11 items-center text-board underline" to="/shop/terms">
          Warranty and labour rate
        </Link>
      </PageHeader>
      <QueryState query={shop} label="the shop">
        {(s) => <ShopForm shop={s} />}
      </QueryState>
      <div className="mt-6">
        <DutyRulesSection />
      </div>
    </div>
  );
}
