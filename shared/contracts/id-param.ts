import { z } from 'zod';

/**
 * The schema of a path's `:id` holding the UUID of a `what` (e.g. "table"): its message names
 * the record, so a 400 reads "table id must be a UUID". Every route with an id takes it from here.
 */
export function idParam(what?: string) {
  return z.object({ id: z.uuid(what ? `${what} id must be a UUID` : 'id must be a UUID') });
}

/** An id in a path, once parsed. */
export type IdParams = z.infer<ReturnType<typeof idParam>>;
