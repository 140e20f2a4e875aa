import type { FieldErrors } from '@/lib/errors';
import { FormField } from './FormField';

/** A new password and its repetition, as every form that sets a password asks for them. */
export function NewPasswordFields({ fields, minLength, repeatLabel }: { fields: FieldErrors; minLength: number; repeatLabel: string }) {
  return (
    <>
      <FormField id="password" label="New password" hint={`At least ${minLength} characters.`} errors={fields.password}>
        <input id="password" name="password" type="password" autoComplete="new-password" minLength={minLength} required className="tp-input" aria-invalid={!!fields.password} />
      </FormField>
      <FormField id="confirm" label={repeatLabel} errors={fields.confirm}>
        <input id="confirm" name="confirm" type="password" autoComplete="new-password" required className="tp-input" aria-invalid={!!fields.confirm} />
      </FormField>
    </>
  );
}
