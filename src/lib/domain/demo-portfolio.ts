import { z } from 'zod';
import { characteristicFieldsSchema, type Characteristic } from './characteristic';
import { improvementProjectFieldsSchema, type ImprovementProject } from './improvement-project';
import { parseFields } from './parse-fields';
import { processFieldsSchema, type Process } from './process';
import { recordMetaSchema } from './record-meta-schema';
import { siteFieldsSchema, type Site } from './site';
import { studyFieldsSchema, type Study } from './study';

/**
 * The demo portfolio as the seed generator writes it: every record complete with its bookkeeping, so that
 * loading it gives the same ids on every device.
 */
export interface DemoPortfolio {
  kind: 'capstan-demo-portfolio';
  version: 1;
  seed: number;
  company: string;
  records: {
    sites: Site[];
    processes: Process[];
    characteristics: Characteristic[];
    studies: Study[];
    projects: ImprovementProject[];
  };
}

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
