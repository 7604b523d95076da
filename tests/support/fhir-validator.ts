// The FHIR R4 validator the server uses (lib/server/fhir-validator.ts), for tests: call
// loadFhirValidator() in beforeAll, then problemsOf(resource) gives its lines.
export { loadFhirValidator, problemsOf } from "@/lib/server/fhir-validator";
