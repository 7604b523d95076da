"use client";
// Registers a patient (no `patient`) or corrects one. The server checks the same schema, the site,
// the record number and possible duplicates; a duplicate warning lists the look-alikes to confirm.
import { useState } from "react";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useForm, useWatch } from "react-hook-form";
import { plainResolver } from "@/components/ui/plain-resolver";
import type { z } from "zod";
import { Button } from "@/components/ui/button";
import { ApiError, sendJson } from "@/components/data/fetcher";
import { api } from "@/components/data/keys";
import { HIV_STATUS, PATIENT_STATUSES, RISK_GROUPS, SEX_AT_BIRTH, type PatientStatus, type RiskGroup } from "@/lib/domain/vocab";
import { GROUP_TEXT } from "@/lib/due-dates/eligibility";
import { registerPatientSchema } from "@/lib/validation/patients";
import { Field, SelectField } from "./patient-fields";
import { ISO_DATE_INPUT } from "@/components/ui/date-input";

type In = z.input<typeof registerPatientSchema>;
type Out = z.output<typeof registerPatientSchema>;

export interface EditedPatient extends Omit<In, "confirmDuplicate" | "riskGroups"> {
  id: string;
  riskGroups: RiskGroup[];
  status: PatientStatus;
  version: number;
}
interface Candidate { id: string; mrn: string; familyName: string; givenName: string; dateOfBirth: string; href: string }

const SEX_WORDS = { female: "Female", male: "Male", intersex: "Intersex", unknown: "Not known" } as const;
const HIV_WORDS = { positive: "Living with HIV", negative: "HIV negative", unknown: "Not known" } as const;
const STATUS_WORDS = { active: "Active: followed on the worklist", inactive: "Inactive: no longer followed here", deceased: "Deceased" } as const;
const GROUPS = RISK_GROUPS.filter((g) => g !== "other");

export function PatientForm(props: { sites: { id: string; name: string }[]; clinicians: { id: string; displayName: string; siteId: string }[]; patient?: EditedPatient; me?: string }) {
  const { sites, clinicians, patient, me } = props;
  const router = useRouter();
  const [message, setMessage] = useState<string | null>(null);
  const [existing, setExisting] = useState<string | null>(null);
  const [candidates, setCandidates] = useState<Candidate[] | null>(null);
  const [status, setStatus] = useState<PatientStatus>(patient?.status ?? "active");
  const form = useForm<In, unknown, Out>({
    resolver: plainResolver(registerPatientSchema),
    defaultValues: patient
      ? { ...patient, postalCode: patient.postalCode ?? "", contactEmail: patient.contactEmail ?? "", riskDate: patient.riskDate ?? "", clinicianId: patient.clinicianId ?? "" }
      : { siteId: sites[0]?.id ?? "", familyName: "", givenName: "", dateOfBirth: "", mrn: "", postalCode: "", contactEmail: "", riskDate: "", clinicianId: clinicians.some((c) => c.id === me && c.siteId === sites[0]?.id) ? me : "", riskGroups: [], hivStatus: "unknown", sexAtBirth: undefined },
  });
  const errors = form.formState.errors;
  const siteId = useWatch({ control: form.control, name: "siteId" });

  async function submit(values: Out, confirmDuplicate = false) {
    setMessage(null);
    setExisting(null);
    try {
      if (patient) {
        // The site is fixed once registered; the edit route takes the fields only.
        const fields = Object.fromEntries(Object.entries(values).filter(([k]) => k !== "siteId" && k !== "confirmDuplicate"));
        await sendJson("PATCH", api.patient(patient.id), { ...fields, status, version: patient.version });
        router.push(`/patients/${patient.id}`);
      } else {
        const res = await sendJson<{ href: string }>("POST", api.patients, { ...values, confirmDuplicate });
        router.push(res.href);
      }
      router.refresh();
    } catch (err) {
      if (!(err instanceof ApiError)) return setMessage("Not saved: the server could not be reached.");
      for (const [field, msgs] of Object.entries(err.fields ?? {})) form.setError(field.split(".")[0] as keyof In, { message: msgs[0] });
      if (err.code === "possible_duplicate") setCandidates((err.detail?.candidates as Candidate[]) ?? []);
      if (err.code === "mrn_taken") setExisting(((err.detail?.existing as { href?: string }) ?? {}).href ?? null);
      setMessage(err.message);
    }
  }

  return (
    <form onSubmit={form.handleSubmit((v) => submit(v))} noValidate aria-label={patient ? "Correct patient details" : "Register a patient"} className="max-w-3xl space-y-5">
      <fieldset className="grid gap-4 sm:grid-cols-2">
        <legend className="mb-2 text-lg font-bold">Identity</legend>
        {!patient && sites.length > 1 ? (
          <SelectField label="Site" error={errors.siteId?.message} {...form.register("siteId")} options={sites.map((s) => [s.id, s.name])} />
        ) : null}
        <Field label="Family name" autoComplete="off" error={errors.familyName?.message} {...form.register("familyName")} />
        <Field label="Given name" autoComplete="off" error={errors.givenName?.message} {...form.register("givenName")} />
        <Field label="Date of birth" {...ISO_DATE_INPUT} error={errors.dateOfBirth?.message} {...form.register("dateOfBirth")} />
        <SelectField label="Sex at birth" error={errors.sexAtBirth?.message} {...form.register("sexAtBirth")} options={SEX_AT_BIRTH.map((s) => [s, SEX_WORDS[s]])} placeholder="Choose…" />
        <Field label="Medical record number" hint="unique at the site" error={errors.mrn?.message} {...form.register("mrn")} />
        <Field label="Postal code" hint="optional" error={errors.postalCode?.message} {...form.register("postalCode")} />
      </fieldset>
      <fieldset className="grid gap-4 sm:grid-cols-2">
        <legend className="mb-2 text-lg font-bold">Screening</legend>
        <SelectField label="HIV status" error={errors.hivStatus?.message} {...form.register("hivStatus")} options={HIV_STATUS.map((s) => [s, HIV_WORDS[s]])} />
        <Field label="Transplant or vulvar diagnosis date" hint="if needed" {...ISO_DATE_INPUT} error={errors.riskDate?.message} {...form.register("riskDate")} />
        <div className="sm:col-span-2">
          <p className="text-sm font-semibold">Risk groups (IANS 2024): tick every one that applies</p>
          <div className="mt-1 grid gap-x-4 sm:grid-cols-2">
            {GROUPS.map((g) => (
              <label key={g} className="flex min-h-11 items-center gap-3">
                <input type="checkbox" value={g} {...form.register("riskGroups")} className="h-5 w-5 accent-lagoon-600" />
                <span>{GROUP_TEXT[g]}</span>
              </label>
            ))}
          </div>
          {errors.riskGroups ? <p className="mt-1 text-sm text-danger-ink">{errors.riskGroups.message ?? "Choose from the list."}</p> : null}
        </div>
      </fieldset>
      <fieldset className="grid gap-4 sm:grid-cols-2">
        <legend className="mb-2 text-lg font-bold">Follow-up</legend>
        <SelectField label="Responsible clinician" error={errors.clinicianId?.message} {...form.register("clinicianId")}
          options={clinicians.filter((c) => c.siteId === (patient?.siteId ?? siteId)).map((c) => [c.id, c.displayName])} placeholder="Not yet assigned" />
        <Field label="E-mail for reminders" hint="optional" type="email" autoComplete="off" error={errors.contactEmail?.message} {...form.register("contactEmail")} />
        {patient ? (
          <SelectField label="Status" name="status" value={status} onChange={(e) => setStatus(e.target.value as PatientStatus)} options={PATIENT_STATUSES.map((s) => [s, STATUS_WORDS[s]])} />
        ) : null}
      </fieldset>
      {message ? (
        <div role="alert" className="rounded-md border-l-4 border-caution-rule bg-caution-bg px-4 py-3 text-caution-ink">
          <p className="font-semibold">{message}</p>
          {existing ? <p className="mt-1"><Link className="text-lagoon-700 underline" href={existing}>Open the registered patient</Link></p> : null}
          {candidates?.length ? (
            <>
              <ul className="mt-2 list-disc pl-6">
                {candidates.map((c) => <li key={c.id}><Link className="text-lagoon-700 underline" href={c.href}>{c.familyName}, {c.givenName}</Link> born {c.dateOfBirth}, record {c.mrn}</li>)}
              </ul>
              <Button type="button" variant="secondary" className="mt-3" onClick={form.handleSubmit((v) => submit(v, true))}>They are different people: register</Button>
            </>
          ) : null}
        </div>
      ) : null}
      <Button type="submit" disabled={form.formState.isSubmitting}>{patient ? "Save changes" : "Register patient"}</Button>
    </form>
  );
}
