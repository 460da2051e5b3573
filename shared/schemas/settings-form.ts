import { z } from 'zod'

/** The studio profile form (owner); the same schema checks the PATCH /api/settings/studio body. */
export const StudioProfileSchema = z.object({
  name: z.string().trim().min(1, 'Enter the studio name.').max(120, 'At most 120 characters.'),
  legalName: z.string().trim().min(1, 'Enter the legal name.').max(160, 'At most 160 characters.'),
  email: z
    .string()
    .trim()
    .max(254)
    .pipe(z.email({ error: 'Enter a valid e-mail address.' })),
  phone: z.string().trim().max(40, 'At most 40 characters.'),
  address: z.array(z.string().trim().max(120, 'At most 120 characters.')).max(5, 'At most five lines.'),
  taxId: z.string().trim().max(40, 'At most 40 characters.'),
})
export type StudioProfileInput = z.infer<typeof StudioProfileSchema>
