import type { ProcedureStepInput } from '../schema'

// Holds that recur across procedures. Each call returns a fresh object so a shop can edit one
// procedure's copy without touching another's.

export const protectiveGear = (key = 'protective-gear'): ProcedureStepInput => ({
  key,
  kind: 'hold',
  title: 'Put on eye, hearing and dust protection',
  body: 'Put on your protection before the spindle starts. Keep it on until the spindle has stopped and the dust has settled.',
  guidance: 'Cutting throws chips fast enough to injure an eye. A router spindle and dust collector together are loud enough to damage hearing over a working day. Fine wood and MDF dust stays in the air long after the cut and is breathed in deep.',
  signalWord: 'WARNING',
  hazard: 'Flying chips can blind you. Long exposure to routing noise causes permanent hearing loss. Wood dust is a known cause of nasal cancer, and MDF dust also carries formaldehyde from its glue.',
  avoid: 'Wear safety glasses with side shields. Wear ear muffs or plugs. Wear a dust mask or respirator rated for fine dust. Tie back long hair and roll up loose sleeves.',
  needsTrainerSignoff: false,
})

export const isolatePower = (key = 'isolate-power', needsTrainerSignoff = true): ProcedureStepInput => ({
  key,
  kind: 'hold',
  title: 'Isolate the power before you unplug anything',
  body: 'Switch the machine off at its main isolator. Lock and tag it with your own lock. Then prove that nothing can start, and put the start control back to off.',
  guidance: 'Cables for the spindle, drives and sensor must never be unplugged live. A drive holds a charge after switch-off: dark drive lights do not prove it has discharged, so wait the time the drive\'s manual gives. A spindle keeps turning as it runs down. Your own lock means nobody else can switch the machine back on while your hands are on it. If the machine is plugged into a socket, unplugging it is enough only while the plug stays under your own control, in your hand or in sight, where nobody else can plug it back in.',
  signalWord: 'WARNING',
  hazard: 'Unplugging a cable with power on can give an electric shock or start the machine without warning. A drive can hold stored energy after switch-off, and a spindle keeps turning as it slows down.',
  avoid: 'Switch off at the main isolator and fit your own lock and tag. Wait until the spindle has stopped, and wait the discharge time the drive\'s manual gives: drive lights going out is not proof. Press the start control to prove nothing moves, then return the control to off. If the machine has a plug, pull it and keep it under your own control, where only you can plug it back in.',
  needsTrainerSignoff,
})

export const stayWithMachine = (key = 'stay-with-machine', needsTrainerSignoff = true): ProcedureStepInput => ({
  key,
  kind: 'hold',
  title: 'Stay with the machine while it cuts',
  body: 'Stay at the machine from the start of the program to the end. Keep one hand free to reach the emergency stop.',
  guidance: 'Most harm from a running router happens in the minutes nobody is watching. A cutter can break, a part can come loose, or chips in the dust shoe can start to smoulder. Stopping early keeps a small problem small.',
  signalWord: 'WARNING',
  hazard: 'A broken cutter or loose part can be thrown across the shop. Hot chips and dust can catch fire. A running machine left alone can seriously injure someone or start a fire.',
  avoid: 'Do not leave the machine while the program runs. Keep others out of the work area. Stop the program at once if the sound changes, smoke appears or the dust collection stops.',
  needsTrainerSignoff,
})

export const spindleStopped = (key = 'spindle-stopped'): ProcedureStepInput => ({
  key,
  kind: 'hold',
  title: 'Stop the spindle before you touch the cutter',
  body: 'Stop the spindle and wait until it no longer turns. Switch the spindle off at its control before your hands go near the collet.',
  guidance: 'A tool change puts your fingers right at the cutter. If a program resumes or someone presses start, the spindle comes up to speed in a second or two, far faster than you can pull back.',
  signalWord: 'WARNING',
  hazard: 'If the spindle starts while your hands are at the collet, the cutter can cause deep cuts or sever fingers.',
  avoid: 'Stop the spindle and wait for it to stop turning. Switch the spindle off at its control or isolate it. Keep the program paused or closed until the wrenches are off the spindle.',
  needsTrainerSignoff: false,
})

export const homingClear = (key = 'homing-clear'): ProcedureStepInput => ({
  key,
  kind: 'hold',
  title: 'Keep clear while the machine homes',
  body: 'Homing moves every axis on its own until each one reaches its switch. Keep your hands out of the gantry path until it is finished.',
  guidance: 'The gantry is heavy and moves without warning when homing starts. The places where it passes the frame or the end stops pinch like a door.',
  signalWord: 'CAUTION',
  hazard: 'The moving gantry and carriage can pinch or strike hands and arms.',
  avoid: 'Keep hands, tools and cables off the rails and the bed. Stand clear of the gantry path. Keep the emergency stop within reach while the axes move.',
  needsTrainerSignoff: false,
})

export const sharpEdges = (key = 'sharp-edges'): ProcedureStepInput => ({
  key,
  kind: 'hold',
  title: 'Handle cutters by the shank',
  body: 'Router bits and surfacing cutters are sharp even when they look dull. Hold them by the shank or in a cloth.',
  guidance: 'Most tool-change cuts happen when a bit slips while the collet nut is being loosened or tightened.',
  signalWord: 'CAUTION',
  hazard: 'Cutting edges can cut fingers and palms, especially when a wrench slips.',
  avoid: 'Hold cutters by the shank or wrap the edges in a cloth. Wear cut-resistant gloves for handling, and take them off before the spindle runs.',
  needsTrainerSignoff: false,
})

export const cutterRating = (key = 'cutter-rating'): ProcedureStepInput => ({
  key,
  kind: 'hold',
  title: 'Check the cutter\'s speed rating and its inserts',
  body: 'Find the maximum speed marked on the surfacing cutter or its sheet. The planned spindle speed must not be above it. Check every insert screw is tight.',
  guidance: 'Large surfacing cutters are often rated well below a spindle\'s top speed. The Planner warns when the speed is above the maximum of a cutter from the shop\'s list. Tighten insert screws with the maker\'s key only.',
  signalWord: 'WARNING',
  hazard: 'A cutter run above its rated speed, or with a loose insert screw, can break apart or throw an insert across the shop and cause serious injury.',
  avoid: 'Keep the spindle speed at or below the cutter\'s marked maximum. Tighten every insert screw before the spindle starts. Replace chipped inserts and damaged screws.',
  needsTrainerSignoff: false,
})

export const finalSignoff = (statement: string): ProcedureStepInput => ({
  key: 'final-signoff',
  kind: 'signoff',
  title: 'Sign off the run',
  body: 'Read the statement below. Sign only if every part of it is true.',
  guidance: 'In a guided run your trainer checks the work with you and signs with their own PIN. Your signature and theirs go into the record.',
  statement,
})

/**
 * The Planner's footer names the hazards of the library's 'protective-gear' and
 * 'stay-with-machine' holds, so it carries their signal word (a test holds them together).
 */
export const PLANNER_SAFETY_LINE = {
  signalWord: 'WARNING',
  text: 'check the preview and the program and clear the bed; wear eye, hearing and dust protection; stay at the machine while it cuts. A thrown cutter or a dust fire can seriously injure.',
} as const
