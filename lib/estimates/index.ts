/** Bandwidth, storage and cost estimates of a site's reduction (DESIGN.md "Metrics"; estimates are estimates, with their assumptions). */
export {
  estimateGroup,
  estimateSite,
  defaultRatio,
  measuredPeakRatio,
  DEFAULT_RATIOS,
  DEFAULT_BITS_PER_SAMPLE,
  DAYS_PER_MONTH,
  BYTES_PER_GB,
  type EstimateTag,
  type OutputRatio,
  type GroupEstimateInput,
  type SiteEstimateInput,
  type GroupEstimate,
  type SiteEstimate,
} from "./model";
