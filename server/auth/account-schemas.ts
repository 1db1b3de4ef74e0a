import { z } from 'zod';

/** A password someone chooses (invitation or reset): long enough to resist guessing. */
export const newPasswordSchema = z
  .string({ error: 'Choose a password.' })
  .min(10, 'A password has at least 10 characters.')
  .max(200, 'A password has at most 200 characters.');

export const emailSchema = z
  .string({ error: 'Enter an e-mail address.' })
  .trim()
  .toLowerCase()
  .max(254, 'An e-mail address has at most 254 characters.')
  .pipe(z.email({ error: 'Enter a valid e-mail address.' }));

export const personNameSchema = z
  .string({ error: 'Enter a name.' })
  .trim()
  .min(1, 'Enter a name.')
  .max(120, 'A name has at most 120 characters.');

/** `:token` of a link: base64url, as issued. */
export const tokenParams = z.object({
  token: z
    .string()
    .regex(/^[A-Za-z0-9_-]{20,100}$/, 'This link is not valid: copy it whole from the e-mail.'),
});

export const choosePasswordBody = z.strictObject({ password: newPasswordSchema });
export const resetRequestBody = z.strictObject({ email: emailSchema });
