// Caution texts shown to users. Each has an id so an acknowledgement can record which text was shown.

export const REGULATED_RECORD_CAUTION = {
  id: "regulated-record/1",
  title: "Regulated record",
  text:
    "Reduction is lossy: the cloud receives fewer samples than the plant measured. For regulated records " +
    "(pasteurisation, safety-instrumented or custody-transfer signals) keep the raw record wherever local " +
    "regulations and licensed practice require it. Sluice does not replace that record and does not decide " +
    "what the law requires; follow your local codes and your qualified engineers.",
} as const;

export const FLEET_STATUS_CAUTION = {
  id: "fleet-status/1",
  title: "Lossy reduction",
  text:
    "Reduction is lossy: the cloud receives fewer samples than the plant measured. A failing gateway may " +
    "still be forwarding with its last good bundle, so what the cloud receives can differ from the target " +
    "release. Keep the raw record wherever local codes and licensed practice require it; Sluice does not " +
    "replace that record.",
} as const;
