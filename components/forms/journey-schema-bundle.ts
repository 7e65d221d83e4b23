// Only ever loaded through loadJourneySchemas() (journey-schemas.ts); never import it directly.
export { journeyDocumentSchema } from '../../shared/journey/journey-schema';
export { scheduleSchema } from '../../shared/journey/schedule-schema';
export { retentionSchema, saveSecretSchema, saveVantageSchema } from '../../shared/schemas/journeys';
