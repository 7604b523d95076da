import type {
  Acetowhite, Adequacy, AnaestheticAgent, Cytology, HpvResult, Lugol, Modality, Morphology, P16, Position, TrackCheckOutcome, TrackStatus, Zone,
} from "@/lib/domain/vocab";

// Words for stored codes, one set for the screens, the printed report and FHIR texts. Trade
// terms as the trade writes them (Bethesda, LAST); our own plain words elsewhere.

export const POSITION_WORDS: Record<Position, string> = { lithotomy: "Lithotomy", prone_jackknife: "Prone jack-knife", left_lateral: "Left lateral (Sims)" };

export const CYTOLOGY_WORDS: Record<Cytology, string> = {
  nilm: "NILM (negative)", asc_us: "ASC-US", asc_h: "ASC-H", lsil: "LSIL", hsil: "HSIL", scc: "Squamous cell carcinoma", unsatisfactory: "Unsatisfactory", not_done: "Not done",
};

export const HPV_WORDS: Record<HpvResult, string> = {
  not_done: "Not done", negative: "Negative", hr_positive_16: "High-risk positive (HPV 16)", hr_positive_other: "High-risk positive (other types)",
  lr_positive: "Low-risk positive",
};

export const ADEQUACY_WORDS: Record<Adequacy, string> = {
  scj_full: "Squamocolumnar junction seen fully", scj_partial: "Squamocolumnar junction seen partially", scj_not_seen: "Squamocolumnar junction not seen",
};

export const MODALITY_WORDS: Record<Modality, string> = {
  electrocautery: "Electrocautery / electrodesiccation",
  infrared_coagulation: "Infrared coagulation",
  laser: "Laser ablation",
  surgical_excision: "Surgical excision",
  topical_imiquimod: "Topical imiquimod",
  topical_fluorouracil: "Topical fluorouracil",
  topical_cidofovir: "Topical cidofovir",
  other: "Other",
};

export const AGENT_WORDS: Record<AnaestheticAgent, string> = { lidocaine: "Lidocaine", bupivacaine: "Bupivacaine" };

export const P16_WORDS: Record<P16, string> = { block_positive: "p16 block positive", not_block: "p16 not block-type", negative: "p16 negative", not_done: "p16 not done" };

export const ZONE_WORDS: Record<Zone, string> = {
  perianal: "Perianal skin", distal_canal: "Distal canal", transformation_zone: "Transformation zone", proximal_canal: "Proximal canal",
  distal_rectum: "Distal rectum",
};

export const MORPHOLOGY_WORDS: Record<Morphology, string> = { flat: "flat", raised: "raised", papillary: "papillary", ulcerated: "ulcerated" };
export const ACETOWHITE_WORDS: Record<Acetowhite, string> = { none: "no acetowhitening", faint: "faint acetowhite", dense: "dense acetowhite" };
export const LUGOL_WORDS: Record<Lugol, string> = {
  not_applied: "", negative: "Lugol's negative", partial: "Lugol's partial", positive: "Lugol's positive",
};

export const STATUS_WORDS: Record<TrackStatus, string> = {
  new: "new", persistent: "persistent", regressed: "regressed", progressed: "progressed", cleared: "cleared", recurrent: "recurrent",
};

/** An earlier track's decision at a later visit, as a phrase after the track's label. */
export const CHECK_WORDS: Record<TrackCheckOutcome, string> = {
  not_found: "looked for, not found",
  treated: "marked treated",
  not_examined: "not examined",
};

export const COMPLICATION_WORDS = { pain: "Pain", bleeding: "Bleeding", other: "Other" } as const;
export const SEVERITY_WORDS = { mild: "Mild", moderate: "Moderate", severe: "Severe" } as const;
