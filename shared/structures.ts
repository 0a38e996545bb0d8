// Extended-Hückel results for the structures a browser's cells ask about (server/structures/,
// src/core/workbook/structures/). The results are functions/chem/ehtSummary.ts EhtResult objects.
import { z } from 'zod';

/** Structures one request may name: a 1,000-row library asks in two or three requests. */
export const maxStructuresPerRequest = 500;
/** Characters of one structure: the longest text a cell holds. */
export const maxStructureChars = 32_767;

export const structuresRequestSchema = z.object({
  inputs: z
    .array(
      z.object({
        structure: z.string().min(1, 'give a structure').max(maxStructureChars, `at most ${maxStructureChars.toLocaleString('en')} characters`),
        charge: z.number().int().min(-20).max(20).optional(),
      }),
    )
    .min(1, 'give at least one structure')
    .max(maxStructuresPerRequest, `at most ${maxStructuresPerRequest} structures per request`),
});
export type StructuresRequest = z.infer<typeof structuresRequestSchema>;

/** 200 from POST /api/workbooks/:id/structures: a result per input, in order, or null while it is computed. */
export interface StructuresResponse<Result = unknown> {
  results: (Result | null)[];
  /** Structures of this workbook still being computed on the server. */
  underWay: number;
}
