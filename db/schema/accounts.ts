import { boolean, doublePrecision, index, integer, jsonb, pgTable, primaryKey, text, timestamp, uuid } from "drizzle-orm/pg-core";
import { positionEnum, roleEnum } from "./enums";

/** A clinic. Every patient-owned row carries its site_id so every query can be scoped by site. */
export const sites = pgTable("sites", {
  id: uuid("id").primaryKey().defaultRandom(),
  code: text("code").notNull().unique(),
  name: text("name").notNull(),
  /** IANA time zone of the clinic (dates of visits and due dates are the clinic's days). */
  timeZone: text("time_zone").notNull().default("UTC"),
  /** The clinic's 5-digit ZIP or other postal code, when given. */
  postalCode: text("postal_code"),
  version: integer("version").notNull().default(1),
  /** Zone boundaries in cm (lib/geometry/zones); null = the sourced defaults. */
  zoneBounds: jsonb("zone_bounds"),
  /** Follow-up intervals in months by rule key (lib/due-dates); null = the defaults. */
  followupRules: jsonb("followup_rules"),
  /** Per-session treated-circumference caution threshold as a fraction; null = default. */
  extentCautionFraction: doublePrecision("extent_caution_fraction"),
  createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
});

export const users = pgTable("users", {
  id: text("id").primaryKey(),
  email: text("email").notNull().unique(),
  displayName: text("display_name").notNull(),
  /** argon2id; null until an invited user sets a password. Never leaves db/. */
  passwordHash: text("password_hash"),
  role: roleEnum("role").notNull(),
  active: boolean("active").notNull().default(true),
  displayConvention: positionEnum("display_convention").notNull().default("lithotomy"),
  createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
});

export const userSites = pgTable(
  "user_sites",
  {
    userId: text("user_id").notNull().references(() => users.id, { onDelete: "cascade" }),
    siteId: uuid("site_id").notNull().references(() => sites.id, { onDelete: "cascade" }),
  },
  (t) => [primaryKey({ columns: [t.userId, t.siteId] }), index("user_sites_site_idx").on(t.siteId)],
);

/** Lucia v3 session table (shape required by @lucia-auth/adapter-drizzle). */
export const sessions = pgTable(
  "sessions",
  {
    id: text("id").primaryKey(),
    userId: text("user_id").notNull().references(() => users.id, { onDelete: "cascade" }),
    expiresAt: timestamp("expires_at", { withTimezone: true, mode: "date" }).notNull(),
    /** When the user signed in: the absolute lifetime counts from here, however often it slid. */
    createdAt: timestamp("created_at", { withTimezone: true, mode: "date" }).notNull().defaultNow(),
  },
  (t) => [index("sessions_user_idx").on(t.userId)],
);

/** Fixed-window counters for rate limits, in the database so several app instances share them. */
export const rateLimits = pgTable("rate_limits", {
  key: text("key").primaryKey(),
  windowStart: timestamp("window_start", { withTimezone: true }).notNull(),
  count: integer("count").notNull(),
  /** The latest counted attempt: a growing delay runs from here. */
  lastHitAt: timestamp("last_hit_at", { withTimezone: true, mode: "date" }).notNull().defaultNow(),
});

export const invitations = pgTable("invitations", {
  id: uuid("id").primaryKey().defaultRandom(),
  email: text("email").notNull(),
  siteId: uuid("site_id").notNull().references(() => sites.id),
  role: roleEnum("role").notNull(),
  tokenHash: text("token_hash").notNull().unique(),
  expiresAt: timestamp("expires_at", { withTimezone: true }).notNull(),
  usedAt: timestamp("used_at", { withTimezone: true }),
  revokedAt: timestamp("revoked_at", { withTimezone: true }),
  invitedBy: text("invited_by").references(() => users.id),
  createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
});

export const passwordResets = pgTable("password_resets", {
  id: uuid("id").primaryKey().defaultRandom(),
  userId: text("user_id").notNull().references(() => users.id, { onDelete: "cascade" }),
  tokenHash: text("token_hash").notNull().unique(),
  expiresAt: timestamp("expires_at", { withTimezone: true }).notNull(),
  usedAt: timestamp("used_at", { withTimezone: true }),
  createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
});
