// React calls a form's onSubmit and ignores what it returns, so an async submit (react-hook-form's handleSubmit,
// or a handler that awaits the API) must not be handed over as it is: a rejection would go nowhere. The forms'
// submits show the API's refusals through their mutation's state; what still rejects is a bug, reported to the
// page's error handler (the console, which the browser tests watch) instead of vanishing.
import type { FormEvent } from 'react';

export function formSubmit(submit: (e: FormEvent) => Promise<unknown>): (e: FormEvent) => void {
  return (e) => {
    submit(e).catch((err: unknown) => reportError(err));
  };
}
