/** Query keys of the planner, beside the shared ones in lib/client/api.ts. */
export const plannerKeys = {
  plantings: (plotId: string) => ['plots', plotId, 'plantings'] as const,
  blends: (propertyId: string) => ['properties', propertyId, 'blends'] as const,
};
