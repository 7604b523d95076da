import { zodResolver } from "@hookform/resolvers/zod";
import type { FieldValues, Resolver } from "react-hook-form";
import type { z } from "zod";
import { plainIssueMessage } from "@/lib/validation/plain-words";

/**
 * The form resolver every client form uses: the form's schema, with the same plain words the
 * server answers with (plainIssueMessage, as lib/http/route.ts parses) for any message the schema
 * does not give itself, never the library's defaults ("Too small: expected number to be >=1").
 */
export function plainResolver<In extends FieldValues, Out>(schema: z.ZodType<Out, In>): Resolver<In, unknown, Out> {
  return zodResolver(schema, { error: plainIssueMessage }) as Resolver<In, unknown, Out>;
}
