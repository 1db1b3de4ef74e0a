import { z } from 'zod';

/**
 * Body of `POST /api/auth/sign-in`. Unknown fields are dropped, not refused: clients may send
 * extras (e.g. a "remember me" flag) and sign-in should not break over them. The length caps
 * refuse a huge password before scrypt spends time on it.
 */
export const signInBody = z.object({
  // Normalised here so the lookup, the attempt limiter and passport all see the same address.
  email: z
    .string({ error: 'Enter your e-mail address.' })
    .trim()
    .toLowerCase()
    .min(1, 'Enter your e-mail address.')
    .max(254, 'An e-mail address has at most 254 characters.'),
  password: z
    .string({ error: 'Enter your password.' })
    .min(1, 'Enter your password.')
    .max(200, 'A password has at most 200 characters.'),
});

export type SignInBody = z.infer<typeof signInBody>;
