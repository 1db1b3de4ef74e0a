import { z } from 'zod';

/** Body of `POST /api/auth/sign-in`. */
export const signInBody = z.object({
  email: z
    .string({ error: 'Enter your e-mail address.' })
    .trim()
    .min(1, 'Enter your e-mail address.')
    .max(254, 'An e-mail address has at most 254 characters.'),
  password: z
    .string({ error: 'Enter your password.' })
    .min(1, 'Enter your password.')
    .max(200, 'A password has at most 200 characters.'),
});

export type SignInBody = z.infer<typeof signInBody>;
