import { z } from 'zod';
import { measureNumber, optionalText, recordId, requiredText } from './field-rules';
import { parseFields } from './parse-fields';
import type { RecordMeta } from './record-meta';

export const DATA_KINDS = ['measured', 'counted'] as const;
export type DataKind = (typeof DATA_KINDS)[number];

/** How much depends on the characteristic: key and safety characteristics are held to stricter targets. */
export const RISK_CLASSES = ['standard', 'key', 'safety'] as const;
export type RiskClass = (typeof RISK_CLASSES)[number];

/** One property of a process output that is checked against a specification. */
export interface CharacteristicFields {
  processId: string;
  name: string;
  unit: string;
  dataKind: DataKind;
  lsl?: number;
  usl?: number;
  target?: number;
  riskClass: RiskClass;
  /** Physical bounds of the quantity (e.g. 0 for a length or a fill weight); values outside are flagged. */
  physicalMin?: number;
  physicalMax?: number;
}
export type Characteristic = CharacteristicFields & RecordMeta;

export const characteristicFieldsSchema = z
  .object({
    processId: recordId('Process'),
    name: requiredText('Characteristic name', 160),
    unit: optionalText('Unit', 40),
    dataKind: z.enum(DATA_KINDS, { error: "Data kind must be 'measured' or 'counted'" }),
    lsl: measureNumber('LSL').optional(),
    usl: measureNumber('USL').optional(),
    target: measureNumber('Target').optional(),
    riskClass: z.enum(RISK_CLASSES, { error: "Risk class must be 'standard', 'key' or 'safety'" }),
    physicalMin: measureNumber('Physical minimum').optional(),
    physicalMax: measureNumber('Physical maximum').optional()
  })
  .superRefine((c, ctx) => {
    if (c.dataKind === 'measured' && c.lsl === undefined && c.usl === undefined) {
      ctx.addIssue({
        code: 'custom',
        path: ['lsl'],
        message: 'A measured characteristic needs at least one limit (LSL or USL)'
      });
    }
    if (c.lsl !== undefined && c.usl !== undefined && !(c.lsl < c.usl)) {
      ctx.addIssue({
        code: 'custom',
        path: ['usl'],
        message: `USL (${c.usl}) must be greater than LSL (${c.lsl})`
      });
    }
    if (c.target !== undefined) {
      if (c.lsl !== undefined && c.target < c.lsl) {
        ctx.addIssue({
          code: 'custom',
          path: ['target'],
          message: `Target (${c.target}) lies below LSL (${c.lsl})`
        });
      }
      if (c.usl !== undefined && c.target > c.usl) {
        ctx.addIssue({
          code: 'custom',
          path: ['target'],
          message: `Target (${c.target}) lies above USL (${c.usl})`
        });
      }
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
