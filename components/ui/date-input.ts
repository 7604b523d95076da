// Dates are typed as the app shows them everywhere, yyyy-mm-dd, whatever the browser's locale:
// a native date input reads and writes in the locale's order (03/14/2027 in one place, 14.03.2027
// in another) beside ISO dates in every table and list. Spread these onto a text input; the
// form's schema (lib/validation/dates) still decides what a real day is.
export const ISO_DATE_INPUT = {
  type: "text",
  pattern: "\\d{4}-\\d{2}-\\d{2}",
  placeholder: "yyyy-mm-dd",
  maxLength: 10,
  autoComplete: "off",
  spellCheck: false,
  title: "A date written yyyy-mm-dd, for example 2027-03-14",
} as const;
