// Closed word lists shared by library blocks, rules and client profiles, so a typo
// in one place is a validation error instead of a rule that silently never fires.

/** Body regions a hold can load and a profile can list as injured. */
export const BODY_REGIONS = [
  'neck', 'shoulder', 'elbow', 'wrist', 'hand', 'chest', 'upper-back', 'lower-back',
  'abdomen', 'hip', 'thigh', 'knee', 'calf', 'ankle', 'foot',
] as const
export type BodyRegion = typeof BODY_REGIONS[number]

/** Health conditions a profile records and a block can be tagged as a caution for. */
export const CONDITIONS = [
  'hypertension', 'heart-disease', 'pregnancy', 'glaucoma', 'retinal-disease', 'hernia',
  'recent-surgery', 'diabetes', 'asthma', 'osteoporosis', 'dizziness',
] as const
export type Condition = typeof CONDITIONS[number]

/** Medication classes that change how exercise should be graded. */
export const MEDICATIONS = [
  'beta-blocker', 'calcium-channel-blocker', 'ace-inhibitor', 'angiotensin-receptor-blocker',
  'diuretic', 'nitrate', 'anticoagulant', 'insulin', 'other',
] as const
export type Medication = typeof MEDICATIONS[number]

/** Blood-pressure guidelines a practice can follow. */
export const GUIDELINES = ['acc-aha-2017', 'esh-2023'] as const
export type Guideline = typeof GUIDELINES[number]

/** Ways a hold's intensity can be set. */
export const INTENSITY_MEASURES = ['knee-angle', 'heart-rate', 'mvc', 'effort'] as const
export type IntensityMeasure = typeof INTENSITY_MEASURES[number]

/** Kinds of rest. */
export const REST_KINDS = ['seated', 'standing', 'walking', 'lying'] as const
export type RestKind = typeof REST_KINDS[number]
