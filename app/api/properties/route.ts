import { requireUser } from '@/lib/auth/session';
import { createProperty, listPropertiesForUser } from '@/lib/data/properties';
import { json, parseBody, route } from '@/lib/http';
import { propertySchema } from '@/lib/validations/property';

export const GET = route(async () => {
  const user = await requireUser();
  return json({ properties: await listPropertiesForUser(user.id) });
});

export const POST = route(async (request) => {
  const user = await requireUser();
  const input = await parseBody(request, propertySchema);
  return json({ property: await createProperty(user.id, input) }, 201);
});
