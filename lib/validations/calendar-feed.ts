import { z } from 'zod';
import { optionalText } from './common';

/** A new calendar feed: an optional label so a person can tell their phones' feeds apart. */
export const calendarFeedSchema = z.object({ label: optionalText('Label', 60) }).strict();

/** A feed token as made by newFeedToken: 43 base64url characters (32 bytes, RFC 4648 §5, no padding). */
export const feedToken = z.string().regex(/^[A-Za-z0-9_-]{43}$/);
