import { z } from 'zod';
import { UnitSchema } from './common';

const XyzSchema = z.object({ x: z.number(), y: z.number(), z: z.number() });

/** What was read from a job's part program: shown on the job and kept beside the text. */
export const PartProgramInfoSchema = z.object({
  name: z.string(),
  size: z.number().int(),
  sha256: z.string(),
  unit: UnitSchema,
  /** False when the program has no G20/G21 and the job's unit was taken. */
  unitDeclared: z.boolean(),
  lines: z.number().int(),
  blocks: z.number().int(),
  /** Every tool change in program order (a tool used twice appears twice). */
  toolChanges: z.array(z.object({ tool: z.number(), line: z.number().int() })),
  tools: z.array(z.number()),
  /** Programmed end points and arc extremes, part coordinates (program zero at the part datum). */
  extents: z.object({ min: XyzSchema, max: XyzSchema }).nullable(),
  workOffset: z.string().nullable(),
  feedMoves: z.number().int(),
  arcs: z.number().int(),
  holes: z.number().int(),
  segments: z.number().int(),
  /** Lowest safe Z this job allows (above the tallest clamp or stock top plus a clearance), template unit. */
  minimumSafeZ: z.number(),
  updatedAt: z.string(),
});
export type PartProgramInfo = z.infer<typeof PartProgramInfoSchema>;

export const PROGRAM_FAMILIES = ['expanded', 'ngc-g10', 'ngc-g52', 'ext-l20', 'shift-rotate'] as const;
export const ProgramFamilySchema = z.enum(PROGRAM_FAMILIES, { message: `family must be one of ${PROGRAM_FAMILIES.join(', ')}.` });
export const ProgramOrderSchema = z.enum(['station', 'tool'], { message: 'order must be station or tool.' });

const csvNumbers = (label: string, max: number) =>
  z.string().max(4000, `${label} is too long.`).transform((s, ctx) => {
    const parts = s.split(',').map((p) => p.trim()).filter((p) => p !== '');
    if (parts.length > max) { ctx.addIssue({ code: 'custom', message: `${label} lists more than ${max} values.` }); return z.NEVER; }
    const out: number[] = [];
    for (const p of parts) {
      const v = Number(p);
      if (!/^[+-]?(\d+\.?\d*|\.\d+)$/.test(p) || !Number.isFinite(v)) { ctx.addIssue({ code: 'custom', message: `${label}: "${p.slice(0, 20)}" is not a number.` }); return z.NEVER; }
      out.push(v);
    }
    return out;
  });

/** GET /api/jobs/:id/program.nc?family=&order=&skip=&safeZ=&base= */
export const TableProgramQuerySchema = z.object({
  family: ProgramFamilySchema.default('expanded'),
  order: ProgramOrderSchema.default('station'),
  skip: csvNumbers('skip', 2000).refine((a) => a.every((v) => Number.isInteger(v) && v >= 1), 'skip lists station numbers: whole numbers from 1, separated by commas.').default([]),
  safeZ: z.coerce.number({ message: 'safeZ must be a number.' }).refine((v) => Number.isFinite(v) && Math.abs(v) <= 100_000, 'safeZ must be a number within ±100000.').optional(),
  base: csvNumbers('base', 3).refine((a) => a.length === 3 && a.every((v) => Math.abs(v) <= 100_000), 'base must be the machine position of the shared offset as x,y,z.').optional(),
});
export type TableProgramQuery = z.infer<typeof TableProgramQuerySchema>;
