import { useMe } from '@/features/auth/api/me';

const intro: Record<string, string> = {
  admin: 'Your shop: people, customers, board library and fault-code tables.',
  lead: 'Jobs waiting for your review, and repairs to sign off.',
  tech: 'Your open jobs on the bench.',
  trainee: 'The steps assigned to you, in guided order.',
};

export function HomePage() {
  const me = useMe();
  if (!me.data) return null;
  return (
    <section className="space-y-2">
      <h1 className="text-2xl font-semibold">Welcome, {me.data.name}</h1>
      <p className="text-stone-700">{intro[me.data.role]}</p>
    </section>
  );
}
