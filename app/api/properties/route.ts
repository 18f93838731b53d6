import { requireUser, requireVerifiedEmail } from '@/lib/auth/session';
import { countOwnedProperties, createProperty, listPropertiesForUser } from '@/lib/data/properties';
import { json, parseBody, route } from '@/lib/http';
import { propertySchema } from '@/lib/validations/property';

export const GET = route(async () => {
  const user = await requireUser();
  return json({ properties: await listPropertiesForUser(user.id) });
});

export const POST = route(async (request) => {
  const user = await requireUser();
  const input = await parseBody(request, propertySchema);
  // One property to try Sowcast with; more once the e-mail is confirmed.
  if (!user.emailVerified && (await countOwnedProperties(user.id)) >= 1) requireVerifiedEmail(user, 'add a second property');
  return json({ property: await createProperty(user.id, input) }, 201);
});
