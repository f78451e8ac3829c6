/** The one query-key factory; every hook takes its keys from here. */
export const keys = {
  me: ['me'] as const,
  buildings: ['buildings'] as const,
  building: (id: string) => ['buildings', id] as const,
  panel: (id: string) => ['panels', id] as const,
};
