import { z } from 'zod';
import { multiLineText, singleLineText } from './text';

/** True for a time zone name the runtime's IANA database knows (e.g. Europe/London, UTC). */
export function isIanaTimeZone(name: string): boolean {
  if (!/^[A-Za-z][A-Za-z0-9_+-]*(\/[A-Za-z0-9_+-]+)*$/.test(name)) return false;
  try {
    new Intl.DateTimeFormat('en-GB', { timeZone: name });
    return true;
  } catch {
    return false;
  }
}

export const timeZoneSchema = z.string().trim().min(1, 'Choose a time zone')
  .refine(isIanaTimeZone, { message: 'Use an IANA time zone name such as Europe/London or America/Chicago' });

export const createSiteBodySchema = z.object({
  name: singleLineText(z.string().trim().min(1, 'Enter a site name').max(160)),
  address: multiLineText(z.string().trim().max(400)).optional().transform((v) => (v ? v : undefined)),
  timeZone: timeZoneSchema,
});
export type CreateSiteBody = z.input<typeof createSiteBodySchema>;

export const siteSchema = z.object({
  id: z.number().int(),
  name: z.string(),
  address: z.string().nullable(),
  timeZone: z.string(),
  surveyCount: z.number().int(),
  createdAt: z.string(),
});
export type Site = z.infer<typeof siteSchema>;

export const siteListResponseSchema = z.object({ items: z.array(siteSchema) });
export type SiteListResponse = z.infer<typeof siteListResponseSchema>;
