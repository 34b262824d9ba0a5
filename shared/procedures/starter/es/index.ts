import type { Translations } from '../../translation'
import { spoilboardResurfacing } from './spoilboard-resurfacing'
import { toolChange } from './tool-change'
import { dailyStartUp } from './daily-start-up'
import { endOfDayShutdown } from './end-of-day-shutdown'
import { emergencyStopTest } from './emergency-stop-test'
import { stockFlattening } from './stock-flattening'
import { spindleTramCheck } from './spindle-tram-check'

// The starter library in Spanish, written the way a shop foreman talks a new hand through the
// job: short sentences, tú, the trade's words ("tabla de sacrificio", "fresa de planeado",
// "cero de pieza"). The safety wording says as much as the English and no less: every hazard,
// every way to avoid it. One file per procedure, beside the English ones in ../ and with the
// same keys; the signal words come from the steps.
export const STARTER_TRANSLATIONS: Readonly<Record<string, Translations>> = {
  'spoilboard-resurfacing': spoilboardResurfacing,
  'tool-change': toolChange,
  'daily-start-up': dailyStartUp,
  'end-of-day-shutdown': endOfDayShutdown,
  'emergency-stop-test': emergencyStopTest,
  'stock-flattening': stockFlattening,
  'spindle-tram-check': spindleTramCheck,
}
