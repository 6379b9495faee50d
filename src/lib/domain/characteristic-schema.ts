import { z } from 'zod';
import { COUNTED_AS, DATA_KINDS, RISK_CLASSES, type CharacteristicFields } from './characteristic';
import { count, measureNumber, optionalText, recordId, requiredText } from './field-rules';
import { parseFields } from './parse-fields';
import { periodProblem } from './period';
import { isoTime } from './record-meta-schema';

/**
 * The validation of a characteristic (zod), apart from its types so that pages which only read records do not load zod:
 * storage loads this when it first writes one.
 */
/** Problems of one set of limits, with the path prefix where they sit (the first limits, or a change). */
function limitIssues(
  l: { lsl?: number | undefined; usl?: number | undefined; target?: number | undefined },
  measured: boolean,
  at: (string | number)[],
  add: (path: (string | number)[], message: string) => void,
  where = ''
): void {
  if (measured && l.lsl === undefined && l.usl === undefined)
    add([...at, 'lsl'], `A measured characteristic needs at least one limit (LSL or USL)${where}`);
  if (l.lsl !== undefined && l.usl !== undefined && !(l.lsl < l.usl))
    add([...at, 'usl'], `USL (${l.usl}) must be greater than LSL (${l.lsl})${where}`);
  if (l.target !== undefined) {
    if (l.lsl !== undefined && l.target < l.lsl)
      add([...at, 'target'], `Target (${l.target}) lies below LSL (${l.lsl})${where}`);
    if (l.usl !== undefined && l.target > l.usl)
      add([...at, 'target'], `Target (${l.target}) lies above USL (${l.usl})${where}`);
  }
}

const limitChangeSchema = z.object({
  from: z
    .string({ error: 'The month a change takes effect is required' })
    .refine((p) => periodProblem(p) === undefined, {
      error: (issue) => periodProblem(issue.input) ?? 'Month is not valid'
    }),
  lsl: measureNumber('LSL').optional(),
  usl: measureNumber('USL').optional(),
  target: measureNumber('Target').optional(),
  reason: optionalText('Reason for the change', 300).optional()
});

export const characteristicFieldsSchema = z
  .object({
    processId: recordId('Process'),
    name: requiredText('Characteristic name', 160),
    unit: optionalText('Unit', 40),
    dataKind: z.enum(DATA_KINDS, { error: "Data kind must be 'measured' or 'counted'" }),
    lsl: measureNumber('LSL').optional(),
    usl: measureNumber('USL').optional(),
    target: measureNumber('Target').optional(),
    limitChanges: z
      .array(limitChangeSchema)
      .max(240, { error: 'At most 240 limit changes are kept' })
      .optional(),
    riskClass: z.enum(RISK_CLASSES, { error: "Risk class must be 'standard', 'key' or 'safety'" }),
    physicalMin: measureNumber('Physical minimum').optional(),
    physicalMax: measureNumber('Physical maximum').optional(),
    subgroupSize: count('Usual subgroup size', 100)
      .min(2, { error: 'Usual subgroup size must be at least 2 (leave it empty for single values)' })
      .optional(),
    countedAs: z.enum(COUNTED_AS, { error: "What is counted must be 'defectives' or 'defects'" }).optional(),
    opportunitiesPerUnit: count('Opportunities per unit', 1e6)
      .min(1, { error: 'Opportunities per unit must be at least 1' })
      .optional(),
    archivedAt: isoTime('Archived at').optional()
  })
  .superRefine((c, ctx) => {
    const add = (path: (string | number)[], message: string) =>
      ctx.addIssue({ code: 'custom', path, message });
    const measured = c.dataKind === 'measured';
    limitIssues(c, measured, [], add);
    const seen = new Set<string>();
    (c.limitChanges ?? []).forEach((change, i) => {
      limitIssues(change, measured, ['limitChanges', i], add, ` (limits from ${change.from})`);
      if (seen.has(change.from))
        add(['limitChanges', i, 'from'], `Two limit changes take effect in ${change.from}; keep one`);
      seen.add(change.from);
    });
    if (measured && (c.countedAs !== undefined || c.opportunitiesPerUnit !== undefined)) {
      add(['countedAs'], 'What is counted and opportunities per unit belong to counted characteristics only');
    }
    if (
      c.countedAs === 'defectives' &&
      c.opportunitiesPerUnit !== undefined &&
      c.opportunitiesPerUnit !== 1
    ) {
      add(
        ['opportunitiesPerUnit'],
        'Defective units are counted once per unit: opportunities per unit apply to defects only'
      );
    }
    if (c.physicalMin !== undefined && c.physicalMax !== undefined && !(c.physicalMin < c.physicalMax)) {
      ctx.addIssue({
        code: 'custom',
        path: ['physicalMax'],
        message: `Physical maximum (${c.physicalMax}) must be greater than physical minimum (${c.physicalMin})`
      });
    }
  });

export function parseCharacteristicFields(input: unknown): CharacteristicFields {
  return parseFields('Characteristic', characteristicFieldsSchema, input);
}
