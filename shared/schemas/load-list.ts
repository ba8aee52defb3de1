import { z } from 'zod';
import { ROW_ID_MAX, TOO_LARGE_ID } from './common';
import { LIMITS } from './limits';

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

/** A whole number from `min` up, refused with `what` (a sentence saying what to send). */
const wholeFrom = (min: number, what: string) => z.number({ message: what }).int(what).min(min, what).max(ROW_ID_MAX, TOO_LARGE_ID);

/** One station's ticks at the machine: the bar is in the station, and the clamp is tightened on it. */
const STATION_NUMBER = 'A station number is a whole number from 1 up, as the load list shows it.';
export const LoadListTickSchema = z.object({
  station: wholeFrom(1, STATION_NUMBER),
  loaded: z.boolean({ message: 'Send loaded as true or false.' }),
  clamped: z.boolean({ message: 'Send clamped as true or false.' }),
});
export type LoadListTick = z.infer<typeof LoadListTickSchema>;

/**
 * Ticks for the stations named (the others keep theirs), made on the load list the operator sees:
 * its stock check and revision, so a tick never lands on a list that changed meanwhile.
 */
export const LoadListTicksInputSchema = z.object({
  /** The ticks' revision the operator read (0 before the first tick on this list). */
  revision: wholeFrom(0, 'Send the ticks revision the load list was read with (ticks.revision, 0 before the first tick).'),
  /** The load list ticked: its stock check and its revision, as GET answered them. */
  stockCheckId: wholeFrom(1, 'Send the stockCheckId of the load list as it was read.'),
  listRevision: wholeFrom(0, 'Send the revision of the load list as it was read.'),
  stations: z.array(LoadListTickSchema).min(1, 'Name at least one station to tick.').max(LIMITS.stations, `Tick at most ${LIMITS.stations} stations at once.`),
});
export type LoadListTicksInput = z.infer<typeof LoadListTicksInputSchema>;

/** The ticks kept for the load list as it stands; none (revision 0) once the list changes. */
export const LoadListTicksSchema = z.object({
  revision: z.number().int(),
  /** Only stations with a tick, ascending. */
  stations: z.array(LoadListTickSchema),
  /** When and by whom the last tick was made, or null before the first. */
  at: z.string().nullable(),
  by: z.string().nullable(),
});
export type LoadListTicks = z.infer<typeof LoadListTicksSchema>;

export const LoadListSchema = z.object({
  /** True when nothing is stored yet and this is Gridset's proposal. */
  proposed: z.boolean(),
  revision: z.number().int(),
  /** The stock check the list was made from. */
  stockCheckId: z.number().int().max(ROW_ID_MAX, TOO_LARGE_ID),
  rails: z.array(LoadListRailSchema.extend({ targetOpening: z.number(), room: z.number(), shift: z.number() })),
  /** Station numbers with no bar this cycle, ascending. */
  emptyStations: z.array(z.number().int()),
  /** Loaded and clamped ticks of this list at the machine; cleared when a new check or an edit changes the list. */
  ticks: LoadListTicksSchema,
});
export type LoadList = z.infer<typeof LoadListSchema>;

