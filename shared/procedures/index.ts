export * from './schema'
export * from './starter-library'
export { isMeaningfulReason, reasonProblem, plainTextProblem, longSentence, MAX_SENTENCE_WORDS, MIN_REASON_CHARS } from './text'
export { checkInUnits, type CheckInUnits } from './check-units'
