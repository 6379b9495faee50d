import { z } from 'zod';
import { characteristicFieldsSchema } from './characteristic-schema';
import type { DemoPortfolio } from './demo-portfolio';
import { improvementProjectFieldsSchema } from './improvement-project-schema';
import { parseFields } from './parse-fields';
import { processFieldsSchema } from './process-schema';
import { recordMetaSchema } from './record-meta-schema';
import { siteFieldsSchema } from './site-schema';
import { studyFieldsSchema } from './study-schema';

/**
 * The validation of the demo portfolio file (zod), apart from its types so that pages which only read records do not load zod:
 * storage loads this when it first writes one.
 */
const withMeta = <S extends z.ZodObject>(schema: S) => schema.extend(recordMetaSchema.shape);

// Characteristic and project schemas carry cross-field checks, which zod keeps through `.and`.
const demoSchema = z.object({
  kind: z.literal('capstan-demo-portfolio', {
    error: 'This is not a Capstan demo portfolio file (kind differs)'
  }),
  version: z.literal(1, { error: 'Unsupported demo portfolio version' }),
  seed: z.number(),
  company: z.string(),
  records: z.object({
    sites: z.array(withMeta(siteFieldsSchema)),
    processes: z.array(withMeta(processFieldsSchema)),
    characteristics: z.array(characteristicFieldsSchema.and(recordMetaSchema)),
    studies: z.array(withMeta(studyFieldsSchema)),
    projects: z.array(improvementProjectFieldsSchema.and(recordMetaSchema))
  })
});

export function parseDemoPortfolio(input: unknown): DemoPortfolio {
  return parseFields('Demo portfolio', demoSchema, input) as unknown as DemoPortfolio;
}
