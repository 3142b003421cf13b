import { Button } from './button';

/**
 * The end of a grid form: the server's (or the form's own) refusal announced to screen readers, then the submit
 * button. `span` is the Tailwind column-span class of the form's grid, so the footer takes a whole row.
 */
export function FormFooter({
  error,
  pending,
  label,
  span,
  variant = 'primary',
}: {
  error?: string;
  pending: boolean;
  label: string;
  span: string;
  variant?: 'primary' | 'secondary';
}) {
  return (
    <>
      <div aria-live="polite" className={span}>
        {error && (
          <p role="alert" className="text-sm text-high">
            {error}
          </p>
        )}
      </div>
      <div className={span}>
        <Button type="submit" disabled={pending} variant={variant}>
          {label}
        </Button>
      </div>
    </>
  );
}
