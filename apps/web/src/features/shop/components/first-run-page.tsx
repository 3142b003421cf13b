import { useState, type FormEvent } from 'react';
import { Navigate, useNavigate } from 'react-router-dom';
import { firstRunRequest } from '@splitscope/contract';
import { Button } from '@/components/ui/button';
import { ErrorNote, TextField } from '@/components/ui/text-field';
import { useSetupStatus } from '@/lib/api/setup-status';
import { AuthCard } from '@/components/ui/auth-card';
import { useFirstRun } from '../api/first-run';
import { updateShop } from '../api/update-shop';
import { uploadLogo } from '../api/upload-logo';
import { formSubmit } from '@/lib/form-submit';

const empty = { name: '', address: '', phone: '', email: '', currency: '', taxNumber: '', adminName: '', adminEmail: '', password: '' };
type Fields = typeof empty;

/** Shop mode, first visit: the shop's details and its first admin. Open only until the shop exists. */
export default function FirstRunPage() {
  const status = useSetupStatus();
  const firstRun = useFirstRun();
  const navigate = useNavigate();
  const [f, setF] = useState<Fields>(empty);
  const [logo, setLogo] = useState<File | null>(null);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [logoError, setLogoError] = useState<string | null>(null);
  if (status.isPending) return <p className="p-6">Loading…</p>;
  // Once this form has created the shop the status says so too; stay until the form has finished.
  if (!status.data?.needsSetup && firstRun.isIdle) return <Navigate to="/sign-in" replace />;

  const bind = (k: keyof Fields) => ({ value: f[k], onChange: (e: { target: { value: string } }) => setF({ ...f, [k]: e.target.value }) });
  const submit = async (e: FormEvent) => {
    e.preventDefault();
    const input = {
      shop: { name: f.name, address: f.address, phone: f.phone, email: f.email, currency: f.currency, taxNumber: f.taxNumber },
      admin: { name: f.adminName, email: f.adminEmail, password: f.password },
    };
    const parsed = firstRunRequest.safeParse(input);
    if (!parsed.success) {
      setErrors(Object.fromEntries(parsed.error.issues.map((i) => [i.path.join('.'), i.message])));
      return;
    }
    setErrors({});
    try {
      await firstRun.mutateAsync(parsed.data);
    } catch {
      return;
    }
    // The shop exists and its admin is signed in; a logo that fails is set again later under Shop.
    if (logo) {
      try {
        const up = await uploadLogo(logo);
        await updateShop({ logoUploadId: up.id });
      } catch (err) {
        setLogoError(`The shop is set up, but the logo was not saved: ${(err as Error).message}. Add it under Shop.`);
        return;
      }
    }
    void navigate('/people', { replace: true });
  };

  return (
    <AuthCard title="Set up your shop" subtitle="Once: the shop's details and its first admin" wide>
      <form onSubmit={formSubmit(submit)} noValidate className="space-y-6">
        <fieldset className="grid gap-4 sm:grid-cols-2">
          <legend className="mb-2 text-lg font-semibold">The shop</legend>
          <TextField label="Shop name" autoComplete="organization" {...bind('name')} error={errors['shop.name']} className="sm:col-span-2" />
          <TextField label="Address" autoComplete="street-address" {...bind('address')} error={errors['shop.address']} className="sm:col-span-2" />
          <TextField label="Phone" type="tel" autoComplete="tel" {...bind('phone')} error={errors['shop.phone']} />
          <TextField label="Shop e-mail" type="email" autoComplete="email" {...bind('email')} error={errors['shop.email']} />
          <TextField
            label="Currency"
            hint="Three letters, e.g. EUR, USD, GBP"
            maxLength={3}
            className="uppercase"
            {...bind('currency')}
            error={errors['shop.currency']}
          />
          <TextField label="Tax number (optional)" {...bind('taxNumber')} error={errors['shop.taxNumber']} />
          <label className="block sm:col-span-2">
            <span className="text-sm font-medium">Logo (optional, PNG or JPEG)</span>
            <input type="file" accept="image/png,image/jpeg" className="mt-1 block min-h-11 w-full" onChange={(e) => setLogo(e.target.files?.[0] ?? null)} />
            <span className="block text-sm text-stone-700">Shown on reports, e-mails and the customer page.</span>
          </label>
        </fieldset>
        <fieldset className="grid gap-4 sm:grid-cols-2">
          <legend className="mb-2 text-lg font-semibold">The first admin (you)</legend>
          <TextField label="Your name" autoComplete="name" {...bind('adminName')} error={errors['admin.name']} />
          <TextField label="Your e-mail" type="email" autoComplete="username" {...bind('adminEmail')} error={errors['admin.email']} />
          <TextField
            label="Password"
            type="password"
            autoComplete="new-password"
            hint="At least 10 characters; common passwords are refused"
            {...bind('password')}
            error={errors['admin.password']}
            className="sm:col-span-2"
          />
        </fieldset>
        <ErrorNote error={firstRun.error} />
        {logoError && (
          <p role="alert" className="rounded-md bg-amber-50 p-2 text-sm">
            {logoError}{' '}
            <a className="underline" href="/people">
              Continue
            </a>
          </p>
        )}
        <Button type="submit" disabled={firstRun.isPending} className="w-full">
          {firstRun.isPending ? 'Setting up…' : 'Create the shop and sign in'}
        </Button>
      </form>
    </AuthCard>
  );
}
