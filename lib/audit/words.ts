// The audit trail in words an administrator reads: each event code as a short sentence and its
// detail as "label: value" pairs. The codes stay in the store and in the filter's value; only
// the page's words change.

const NOUN: Record<string, string> = {
  addendum: "Addendum", anaesthetic: "Anaesthetic dose", attachment: "File", biopsy: "Biopsy", complication: "Complication",
  consent: "Consent", diagnosis: "Diagnosis", enrolment: "Study enrolment", fhir: "FHIR export", followup: "Follow-up",
  invitation: "Invitation", lesion: "Lesion", password_reset: "Password reset", patient: "Patient", quality: "Quality figures",
  reminders: "Reminders", review: "Review", reviews: "Reviews for me", sign_in: "Sign-in", sign_out: "Signed out", site: "Site",
  study: "Study", treatment: "Treatment", user: "Staff member", visit: "Visit", worklist: "Worklist",
};

const VERB: Record<string, string> = {
  create: "added", update: "changed", delete: "removed", read: "opened", list: "listed", upload: "uploaded", record: "recorded",
  withdraw: "withdrawn", confirm: "confirmed", unconfirm: "unconfirmed", export: "exported", deidentified: "exported de-identified",
  accepted: "accepted", created: "sent", first_admin: "used for the first administrator", resent: "sent again", revoked: "withdrawn",
  completed: "completed", requested: "requested", import: "imported", queued: "queued", request: "requested", adjudicate: "verdict recorded",
  resolve: "disagreement resolved", sign_off: "signed off", viewed: "viewed", failed: "failed", rate_limited: "blocked for too many attempts",
  succeeded: "succeeded", sign: "signed", report: "report printed", sites: "sites changed", rules_changed: "rules changed",
  override_set: "own date set", timeline: "timeline", map: "map", exam: "exam details", addenda: "addenda", treatments: "treatments",
  anaesthetic: "anaesthetic doses", complications: "complications", diagnoses: "diagnoses",
};

const plain = (code: string) => code.replace(/_/g, " ");

/** "visit.treatments.read" → "Visit treatments opened"; an unknown code keeps its parts, spaced. */
export function eventWords(action: string): string {
  const [head = "", ...rest] = action.split(".");
  const words = [NOUN[head] ?? plain(head), ...rest.map((p) => VERB[p] ?? plain(p))].join(" ");
  return words.charAt(0).toUpperCase() + words.slice(1);
}

const LABEL = (key: string) => plain(key.replace(/([a-z])([A-Z])/g, "$1 $2")).toLowerCase();

function valueWords(v: unknown): string {
  if (v === null || v === undefined || v === "") return "—";
  if (Array.isArray(v)) return v.length ? v.map(valueWords).join(", ") : "none";
  if (typeof v === "object") {
    const parts = Object.entries(v as Record<string, unknown>).map(([k, x]) => `${LABEL(k)} ${valueWords(x)}`);
    return parts.length ? parts.join(", ") : "nothing";
  }
  if (typeof v === "boolean") return v ? "yes" : "no";
  return String(v);
}

/** { before: {}, after: { clear_exam: 6 } } → "before: nothing · after: clear exam 6". */
export function detailWords(detail: unknown, maxChars = 200): string {
  if (!detail || typeof detail !== "object") return "";
  const text = Object.entries(detail as Record<string, unknown>).map(([k, v]) => `${LABEL(k)}: ${valueWords(v)}`).join(" · ");
  return text.length > maxChars ? `${text.slice(0, maxChars - 1)}…` : text;
}
