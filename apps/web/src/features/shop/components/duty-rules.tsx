import { roleLabels, roles, type DutyRules, type Role } from '@splitscope/contract';
import { SelectField } from '@/components/ui/select-field';
import { QueryState } from '@/components/ui/query-state';
import { ErrorNote } from '@/components/ui/text-field';
import { useDutyRules, useUpdateDutyRules } from '../api/duty-rules';

function DutyRulesForm({ rules }: { rules: DutyRules }) {
  const update = useUpdateDutyRules();
  return (
    <div className="space-y-4">
      <fieldset className="space-y-2">
        <legend className="font-medium">Who approves a diagnosis</legend>
        <label className="flex min-h-11 items-center gap-3">
          <input
            type="radio"
            name="self-approval"
            className="h-5 w-5"
            checked={!rules.selfApproval}
            disabled={update.isPending}
            onChange={() => update.mutate({ selfApproval: false })}
          />
          <span>A second person: whoever proposed the part may not approve it (recommended)</span>
        </label>
        <label className="flex min-h-11 items-center gap-3">
          <input
            type="radio"
            name="self-approval"
            className="h-5 w-5"
            checked={rules.selfApproval}
            disabled={update.isPending}
            onChange={() => update.mutate({ selfApproval: true })}
          />
          <span>The proposer may approve their own diagnosis (a one-person shop)</span>
        </label>
      </fieldset>
      <SelectField
        label="Who may correct a reading someone else took"
        value={rules.correctOthersMinRole}
        options={[...roles].reverse()}
        labels={Object.fromEntries(roles.map((r) => [r, r === 'admin' ? 'Shop admins only' : `${roleLabels[r]} and above`])) as Record<Role, string>}
        disabled={update.isPending}
        onChange={(correctOthersMinRole) => update.mutate({ correctOthersMinRole })}
        hint="Everyone may always correct their own readings."
        className="max-w-md"
      />
      <div aria-live="polite">
        <ErrorNote error={update.error} />
        {update.isSuccess && <p className="text-sm font-semibold text-ok">Saved.</p>}
      </div>
    </div>
  );
}

/** The shop's separation of duties, saved as soon as a choice changes. */
export function DutyRulesSection() {
  const rules = useDutyRules();
  return (
    <section aria-labelledby="duty-rules" className="space-y-2 rounded-lg border border-stone-300 bg-white p-4">
      <h2 id="duty-rules" className="text-lg font-semibold">
        Duty rules
      </h2>
      <QueryState query={rules} label="the duty rules">
        {(r) => <DutyRulesForm rules={r} />}
      </QueryState>
    </section>
  );
}
