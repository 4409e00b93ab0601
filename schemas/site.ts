import { z } from "zod";
import { NAME_CONTROL_MESSAGE, TEXT_CONTROL_MESSAGE, noControlInName, noControlInText } from "./text";

export const SLUG_PATTERN = /^[a-z0-9](?:[a-z0-9-]{0,62}[a-z0-9])?$/;
const slug = z
  .string()
  .trim()
  .min(1, "Enter a slug.")
  .max(64, "At most 64 characters.")
  .regex(SLUG_PATTERN, "Lower-case letters, digits and single hyphens; no hyphen at either end.");

/** IANA time-zone names this runtime knows (plus UTC). */
export function timeZones(): string[] {
  const zones = Intl.supportedValuesOf("timeZone");
  return zones.includes("UTC") ? zones : ["UTC", ...zones];
}

function isTimeZone(tz: string) {
  try {
    new Intl.DateTimeFormat("en", { timeZone: tz });
    return tz === "UTC" || timeZones().includes(tz);
  } catch {
    return false;
  }
}

// Form fields send numbers as text, JSON sends numbers: only text is converted, so that
// null, true, "" or [] are refused instead of being read as 0 or 1.
const number = (label: string) =>
  z.preprocess((v) => (typeof v === "string" && v.trim() !== "" ? Number(v) : v), z.number({ message: `${label} must be a number.` }));

// Tags in no group: pass through or drop; "a chosen profile" arrives with reduction profiles.
export const DEFAULT_HANDLINGS = ["pass-through", "drop"] as const;

export const siteSchema = z.object({
  name: z.string().trim().min(1, "Enter a name.").max(120, "At most 120 characters.").refine(noControlInName, NAME_CONTROL_MESSAGE),
  slug,
  timeZone: z.string().refine(isTimeZone, "Choose a time zone from the IANA list (e.g. Europe/London)."),
  // The column holds three decimals below a billion (DECIMAL(12,3)).
  uplinkBudgetKbps: number("Uplink budget").pipe(z.number().min(0.001, "Uplink budget is at least 0.001 kbit/s.").max(999_999_999, "At most 999,999,999 kbit/s.")),
  storagePricePerGbMonth: number("Storage price").pipe(z.number().min(0, "Storage price cannot be negative.").max(1e6)),
  retentionMonths: number("Retention").pipe(z.number().int("Retention is a whole number of months.").min(1, "At least 1 month.").max(1200)),
  defaultHandling: z.enum(DEFAULT_HANDLINGS, { message: "Choose pass-through or drop." }),
  bytesPerSample: number("Bytes per sample").pipe(z.number().int("Bytes per sample is a whole number.").min(1, "At least 1 byte.").max(256, "At most 256 bytes.")).default(16),
  transportOverheadPct: number("Transport overhead").pipe(z.number().min(0, "Overhead cannot be negative.").max(200, "At most 200 %.")).default(10),
  uplinkHeadroomPct: number("Uplink headroom").pipe(z.number().min(0, "Headroom cannot be negative.").max(90, "At most 90 %.")).default(20),
});
export type SiteInput = z.input<typeof siteSchema>;
export type SiteValues = z.output<typeof siteSchema>;

export const gatewaySchema = z.object({
  name: z.string().trim().min(1, "Enter a name.").max(120, "At most 120 characters.").refine(noControlInName, NAME_CONTROL_MESSAGE),
  slug,
  description: z.string().trim().max(500, "At most 500 characters.").refine(noControlInText, TEXT_CONTROL_MESSAGE).default(""),
  pollSeconds: number("Poll interval").pipe(
    z.number().int("Poll interval is a whole number of seconds.").min(5, "At least 5 s.").max(86400, "At most 86,400 s (a day)."),
  ),
});
export type GatewayInput = z.input<typeof gatewaySchema>;
export type GatewayValues = z.output<typeof gatewaySchema>;

// An id from a path (text) or from a client (a number): only text is converted, so true or [5] are not read as 1 or 5.
export const idSchema = z.preprocess((v) => (typeof v === "string" && v.trim() !== "" ? Number(v) : v), z.number().int().positive());
