import { defineConfig, globalIgnores } from "eslint/config";
import nextVitals from "eslint-config-next/core-web-vitals";
import nextTs from "eslint-config-next/typescript";

// The layering (DEVELOPERS.md, "Layering"), enforced: a forbidden import fails `npm run lint`,
// which scripts/test.sh runs. Routes → services (lib/server) → statements (db/queries); pure
// domain modules import no database, framework or screen; screens import no database or route.
const PURE_LIB = ["accounts", "api", "codes", "dates", "deidentify", "domain", "dosing", "due-dates", "fhir", "geometry", "ids", "map", "patient-import", "quality", "stats", "timeline", "tracking", "validation"];
const zone = (target, from, message) => ({ target, from, message });
const layering = [
  zone("./app", ["./db/client.ts", "./db/schema"], "Routes and pages reach the database through services (lib/server) or read statements (db/queries), never the client or the schema."),
  zone("./app", "./db/queries/audit-write.ts", "Routes and pages record audit rows through lib/server (services, or lib/server/audit.ts for a page's read)."),
  zone("./components", ["./db", "./app", "./lib/server"], "Screens read no database, route or service: data comes from props or the API (components/data)."),
  ...PURE_LIB.map((dir) => zone(`./lib/${dir}`, ["./db", "./app", "./components", "./lib/server", "./lib/auth", "./lib/http", "./lib/mail", "./lib/storage", "./lib/report"], "Pure domain modules take values and return values: no database, route, screen or I/O module.")),
  zone("./lib/report", ["./db", "./app", "./components"], "The PDF reads the map's encoding from lib/map, not from screens."),
  zone("./lib/mail", ["./db", "./app", "./components"], "lib/mail is transport, configuration and templates; the outbox is a service (lib/server/outbox.ts)."),
  zone("./lib/http", ["./db", "./app", "./components"], "The route wrappers reach the database through services."),
  zone("./db/queries", ["./lib/server", "./app", "./components"], "Statements are SQL only: services call them, not the other way round."),
  zone("./lib/server", ["./db/schema", "./app", "./components"], "Services call statements (db/queries); they build no SQL of their own."),
];

export default defineConfig([
  ...nextVitals,
  ...nextTs,
  {
    files: ["app/**", "components/**", "lib/**", "db/**"],
    rules: { "import/no-restricted-paths": ["error", { basePath: process.cwd(), zones: layering }] },
  },
  {
    files: PURE_LIB.map((dir) => `lib/${dir}/**`),
    ignores: ["**/*.test.ts"],
    rules: {
      "no-restricted-imports": ["error", { patterns: [{ group: ["next", "next/*", "react", "react-dom", "react/*", "server-only", "postgres", "drizzle-orm", "drizzle-orm/*"], message: "Pure domain modules import no framework, React or database package." }] }],
    },
  },
  globalIgnores([".next/**", ".next-*/**", ".data/**", "bench/**", "db/migrations/**", "node_modules/**"]),
]);
