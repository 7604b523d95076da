import type { z } from "zod";

// Field messages in plain words for every schema that does not give its own: the library's
// defaults ("Too small: expected number to be >=1") are written for programmers.
type Issue = z.core.$ZodRawIssue;

const num = (v: unknown) => (typeof v === "bigint" ? Number(v) : (v as number));

export function plainIssueMessage(issue: Issue): string {
  switch (issue.code) {
    case "invalid_type":
      if (issue.input === undefined || issue.input === null) return "Required.";
      if (issue.expected === "int") return "Enter a whole number.";
      if (issue.expected === "number") return "Enter a number.";
      if (issue.expected === "string") return "Enter text.";
      if (issue.expected === "boolean") return "Choose yes or no.";
      if (issue.expected === "array") return "Choose from the list.";
      return "This value is not of the expected kind.";
    case "too_small": {
      const min = num(issue.minimum);
      if (issue.origin === "string") return min <= 1 ? "Required." : `Use at least ${min} characters.`;
      if (issue.origin === "array" || issue.origin === "set") return min <= 1 ? "Choose at least one." : `Choose at least ${min}.`;
      return issue.inclusive === false ? `Enter a number above ${min}.` : `Enter a number of at least ${min}.`;
    }
    case "too_big": {
      const max = num(issue.maximum);
      if (issue.origin === "string") return `Use at most ${max} characters.`;
      if (issue.origin === "array" || issue.origin === "set") return `Choose at most ${max}.`;
      return issue.inclusive === false ? `Enter a number below ${max}.` : `Enter a number of at most ${max}.`;
    }
    case "invalid_value":
      return "Choose one of the options.";
    case "invalid_format":
      if (issue.format === "date") return "Use a date written YYYY-MM-DD.";
      if (issue.format === "email") return "Enter an e-mail address.";
      if (issue.format === "uuid") return "Not a valid id.";
      return "Check the format.";
    case "not_multiple_of":
      return `Use steps of ${num(issue.divisor)}.`;
    case "unrecognized_keys":
      return `Not a field here: ${issue.keys.join(", ")}.`;
    default:
      return "Check this value.";
  }
}
