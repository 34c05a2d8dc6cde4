/**
 * The build plan every new company starts with. The admin may edit the company's copy;
 * each tank then gets its own copy of that. Checklist wording is Tidewright's own.
 */
export interface PlanTemplateStage {
  key: string
  title: string
  checklist: string[]
}

export const DEFAULT_PLAN_TEMPLATE: readonly PlanTemplateStage[] = [
  {
    key: 'site-survey',
    title: 'Site survey',
    checklist: [
      'Window light and direct sun checked; shading planned',
      'Floor protection agreed',
      'Floor load estimate recorded and, where needed, referred to a structural engineer',
      'Stand level in both directions',
      'Outlets near the tank are GFCI/RCD protected; drip loops planned (local electrical code applies)',
    ],
  },
  {
    key: 'leak-test',
    title: 'Leak test',
    checklist: ['Filled with fresh water', 'Start time recorded', 'Seams and fittings inspected after 24-48 h', 'Result recorded with a photo'],
  },
  {
    key: 'rinse-prepare',
    title: 'Rinse and prepare',
    checklist: ['Tank drained and wiped', 'Pumps, heater and skimmer rinsed', 'Filter media rinsed in purified water'],
  },
  {
    key: 'substrate',
    title: 'Substrate',
    checklist: ['Target depth chosen', 'Sand rinsed', 'Sand laid to depth'],
  },
  {
    key: 'rockwork',
    title: 'Rockwork',
    checklist: ['Rock type recorded (live or dry)', 'Pest inspection or dip done', 'Structure stable on the tank floor, not on sand'],
  },
  {
    key: 'water-fill',
    title: 'Water and fill',
    checklist: ['Water source recorded', 'Purified water reads TDS 0 (mixed salt only)', 'Salt mixed for the net volume', 'Salinity checked against target'],
  },
  {
    key: 'cycling',
    title: 'Cycling',
    checklist: ['Cycle method chosen', 'Ammonia source and dose recorded', 'Bottled bacteria added', 'Client shown how to test daily'],
  },
  {
    key: 'lighting-ramp',
    title: 'Lighting ramp',
    checklist: ['Photoperiod set', 'Ramps up and down set', 'Plateau intensity set', 'Weekly acclimation steps agreed'],
  },
  {
    key: 'first-livestock',
    title: 'First livestock',
    checklist: ['Stocking order agreed with the client', 'Acclimation method explained', 'Ammonia re-test booked after each addition'],
  },
]
