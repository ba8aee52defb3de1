import { z } from 'zod';
import { ROW_ID_MAX, TOO_LARGE_ID } from './common';

/** The load list of a job's cycle (shared/clamps/load-list.ts): one setting per jaw rail, one bar per station. */
export const LoadListStationSchema = z.object({
  station: z.number().int().min(1),
  /** The bar loaded there, or null for a station left empty this cycle. */
  bar: z.string().max(64).nullable(),
});

export const LoadListRailSchema = z.object({
  jawPlacement: z.string().min(1).max(40),
  /** Index into that rail's stock-check settings: the setting the rail is set to this cycle. */
  setting: z.number().int().min(0).max(10_000),
  stations: z.array(LoadListStationSchema).max(20_000),
});

export const LoadListInputSchema = z.object({
  rails: z.array(LoadListRailSchema).max(1_000),
  /** The revision the operator edited, so two people saving at once do not overwrite each other unseen. */
  revision: z.number().int().min(0).optional(),
});
export type LoadListInput = z.infer<typeof LoadListInputSchema>;

export const LoadListSchema = z.object({
  /** True when nothing is stored yet and this is Gridset's proposal. */
  proposed: z.boolean(),
  revision: z.number().int(),
  /** The stock check the list was made from. */
  stockCheckId: z.number().int().max(ROW_ID_MAX, TOO_LARGE_ID),
  rails: z.array(LoadListRailSchema.extend({ targetOpening: z.number(), room: z.number(), shift: z.number() })),
  /** Station numbers with no bar this cycle, ascending. */
  emptyStations: z.array(z.number().int()),
});
export type LoadList = z.infer<typeof LoadListSchema>;

