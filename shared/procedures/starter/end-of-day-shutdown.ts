import type { StarterProcedure } from './types'
import { SUPPLEMENT_NOTICE } from '../schema'
import { homingClear, finalSignoff } from './common-steps'

export const endOfDayShutdown: StarterProcedure = {
  slug: 'end-of-day-shutdown',
  title: 'Shut the machine down for the day',
  summary: 'Stop and park the machine, clean up dust safely, and switch off the spindle, chiller, extraction and power in the right order.',
  category: 'daily',
  supplementNotice: SUPPLEMENT_NOTICE,
  steps: [
    {
      key: 'stop-program',
      kind: 'instruction',
      title: 'Finish or stop the program',
      body: 'Let the last program finish, or stop it at a safe point. Stop the spindle and wait until it no longer turns.',
      guidance: 'A spindle takes several seconds to run down. Wait for it before reaching in.',
    },
    homingClear('parking-clear'),
    {
      key: 'park',
      kind: 'instruction',
      title: 'Park the gantry',
      body: 'Raise Z to the top. Move the gantry to its parking position at the back of the bed.',
      guidance: 'A parked gantry leaves the bed clear for cleaning and keeps the spindle away from anyone walking past.',
    },
    {
      key: 'remove-tool',
      kind: 'instruction',
      title: 'Remove the cutter',
      body: 'With the spindle switched off, remove the bit from the collet. Put it back in its holder.',
      guidance: 'An empty spindle overnight means nobody gets cut reaching across the bed in the morning.',
    },
    {
      key: 'dust-clean',
      kind: 'hold',
      title: 'Vacuum the dust, never blow it',
      body: 'Fine wood and MDF dust is harmful to breathe. Clean with a vacuum, not compressed air, and keep your mask on.',
      guidance: 'Blowing dust off with compressed air puts the finest, most harmful dust back into the air for hours.',
      signalWord: 'WARNING',
      hazard: 'Wood dust is a known cause of nasal cancer, and MDF dust carries formaldehyde. Blowing it off puts it into the air you breathe.',
      avoid: 'Vacuum the bed, rails, gantry and dust shoe. Wear your dust mask while cleaning. Never clean with compressed air.',
      needsTrainerSignoff: false,
    },
    {
      key: 'clean-machine',
      kind: 'instruction',
      title: 'Clean the machine',
      body: 'Vacuum the bed, the rails, the gantry and the dust shoe. Wipe the rails with a dry cloth.',
      guidance: 'Dust on the rails works into the bearings and belts.',
    },
    {
      key: 'collector-empty',
      kind: 'instruction',
      title: 'Check the dust collector',
      body: 'Empty the collector bag or bin if it is more than two thirds full. Close the blast gate at the machine.',
      guidance: 'Emptying at the end of the day means a full collector never starts the next shift.',
    },
    {
      key: 'chiller-off',
      kind: 'instruction',
      title: 'Switch off the chiller',
      body: 'On a water-cooled spindle, let the chiller run a few minutes after the spindle stops. Then switch it off. Skip this on other spindles.',
      guidance: 'The short run-on carries the last heat away from the spindle.',
    },
    {
      key: 'power-off',
      kind: 'instruction',
      title: 'Switch off the power',
      body: 'Close the controller software. Switch off the machine at the main isolator. Switch off the dust collector.',
      guidance: 'Switching off at the isolator means nothing can start overnight.',
    },
    {
      key: 'end-notes',
      kind: 'instruction',
      title: 'Note anything unusual',
      body: 'Add a note for anything that needs attention before tomorrow: a worn bit, a noise, a damaged hose.',
      guidance: 'The morning start-up shows these notes to the next person.',
    },
    finalSignoff('The machine is parked, cleaned and switched off, the cutter is out of the spindle and the dust collector is ready for tomorrow.'),
  ],
}
