// The words of every mail Dentate sends. Mail crosses systems we do not control, so no mail
// carries a diagnosis, a finding or a record number: only what the reader needs and a link.
import { ROLE_LABEL } from "@/lib/domain/vocab";
import type { Role } from "@/lib/domain/vocab";

export interface MailContent {
  subject: string;
  text: string;
}

const SIGN_OFF = "\n\n— Dentate\nThis message was sent automatically; replies are not read.";

export function invitationMail(a: { link: string; siteName: string; role: Role; invitedByName: string; expiresAt: Date }): MailContent {
  return {
    subject: "Your Dentate account is ready to set up",
    text:
      `${a.invitedByName} has invited you to Dentate at ${a.siteName} as ${ROLE_LABEL[a.role].toLowerCase()}.\n\n` +
      `Choose your password here (the link works once, until ${a.expiresAt.toISOString().slice(0, 16).replace("T", " ")} UTC):\n${a.link}\n\n` +
      "If you did not expect this invitation, ignore this message." + SIGN_OFF,
  };
}

export function resetMail(a: { link: string }): MailContent {
  return {
    subject: "Reset your Dentate password",
    text:
      `Someone asked to reset the password of the Dentate account for this address.\n\n` +
      `Choose a new password here (the link works once, for one hour):\n${a.link}\n\n` +
      "If it was not you, ignore this message: your password stays as it is." + SIGN_OFF,
  };
}

export function clinicianDigestMail(a: { displayName: string; overdueCount: number; link: string }): MailContent {
  const who = a.overdueCount === 1 ? "1 patient is" : `${a.overdueCount} patients are`;
  return {
    subject: "Dentate: patients overdue for follow-up",
    text: `Hello ${a.displayName},\n\n${who} past the date of their next visit under your care.\n\nOpen your worklist:\n${a.link}` + SIGN_OFF,
  };
}

/**
 * Neutral on purpose: a shared mailbox or a lock screen must not reveal why the person is seen.
 * Signed with the clinic's own name, not the product's: "Dentate" names a part of the anal canal.
 */
export function patientReminderMail(a: { givenName: string; clinicName: string }): MailContent {
  return {
    subject: "Time to book your next appointment",
    text:
      `Dear ${a.givenName},\n\nIt is time to book your next appointment with ${a.clinicName}. Please contact the clinic to arrange a date.` +
      `\n\n— ${a.clinicName}\nThis message was sent automatically; replies are not read.`,
  };
}

export function reviewRequestedMail(a: { reviewerName: string; requestedByName: string; link: string }): MailContent {
  return {
    subject: "Dentate: a review was requested of you",
    text: `Hello ${a.reviewerName},\n\n${a.requestedByName} asked you to review a visit.\n\nOpen the review:\n${a.link}` + SIGN_OFF,
  };
}
