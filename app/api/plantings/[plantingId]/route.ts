import { requireRoleFor } from '@/lib/auth/roles';
import { requireUser } from '@/lib/auth/session';
import { getStepRows, toStepDto } from '@/lib/data/plantings';
import { deletePlanting, getPlantingWithPlace, toPlantingDto } from '@/lib/data/steps';
import { json, notFound, route } from '@/lib/http';
import type { Role } from '@/lib/validations/membership';
import { uuid } from '@/lib/validations/common';

type Context = { params: Promise<{ plantingId: string }> };

async function requirePlantingRole(plantingId: string, needed: Role) {
  const user = await requireUser();
  if (!uuid.safeParse(plantingId).success) throw notFound();
  const planting = await getPlantingWithPlace(plantingId);
  if (!planting) throw notFound();
  const access = await requireRoleFor(user, planting.property_id, needed);
  return { ...access, planting };
}

/** One planting with its steps and the plan's warnings. Everyone who may see the plot. */
export const GET = route(async (_request, { params }: Context) => {
  const { plantingId } = await params;
  const { planting, role } = await requirePlantingRole(plantingId, 'viewer');
  const { property_id: propertyId, ...row } = planting;
  const dto = toPlantingDto(row);
  const steps = (await getStepRows(plantingId)).map(toStepDto);
  return json({ planting: { ...dto, propertyId }, steps, warnings: dto.warnings, role });
});

/** Removes a planting with its steps and their history. Managers and owners. */
export const DELETE = route(async (_request, { params }: Context) => {
  const { plantingId } = await params;
  await requirePlantingRole(plantingId, 'manager');
  await deletePlanting(plantingId);
  return new Response(null, { status: 204 });
});
