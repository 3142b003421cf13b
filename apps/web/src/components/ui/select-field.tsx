/** A labelled drop-down with a 44 px touch target; the label may be for screen readers only (a row's own select). */
export function SelectField<T extends string>({
  label,
  value,
  options,
  labels,
  onChange,
  hint,
  hideLabel = false,
  disabled,
  className = '',
}: {
  label: string;
  value: T;
  options: readonly T[];
  labels: Record<T, string>;
  onChange: (value: T) => void;
  hint?: string;
  hideLabel?: boolean;
  disabled?: boolean;
  className?: string;
}) {
  return (
    <label className={`block ${className}`}>
      <span className={hideLabel ? 'sr-only' : 'text-sm font-medium'}>{label}</span>
      <select
        className={`${hideLabel ? '' : 'mt-1 '}block min-h-11 w-full rounded-md border border-stone-500 bg-white px-2`}
        value={value}
        disabled={disabled}
        onChange={(e) => onChange(e.target.value as T)}
      >
        {options.map((o) => (
          <option key={o} value={o}>
            {labels[o]}
          </option>
        ))}
      </select>
      {hint && <span className="block text-sm text-stone-700">{hint}</span>}
    </label>
  );
}
