// Signal words of hold steps. The four words, their meanings and colours follow ANSI Z535.4
// §4.14 (product safety signs, 2007 edition) and Z535.6 (instructions); ISO 3864-2 uses the
// first three only (that it has no NOTICE is from memory). The meanings below are in our own words.

export const SIGNAL_WORDS = ['DANGER', 'WARNING', 'CAUTION', 'NOTICE'] as const
export type SignalWord = typeof SIGNAL_WORDS[number]

export interface SignalWordInfo {
  word: SignalWord
  /** 4 = most severe. Sorts holds and picks the strongest word on a screen. */
  rank: 1 | 2 | 3 | 4
  /** Who or what gets hurt if the hazard is not avoided. */
  harm: 'death or serious injury' | 'minor or moderate injury' | 'property or equipment damage'
  /** "will" (DANGER) or "could" (WARNING, CAUTION); null for NOTICE, which is not about injury. */
  likelihood: 'will' | 'could' | null
  /** One-line meaning shown in the Library editor's picker. */
  meaning: string
  /** The standard's colour name for the signal panel. */
  colour: 'red' | 'orange' | 'yellow' | 'blue'
  /** Screen colours for the panel (our own sRGB choices; the standard defines the hues). */
  background: string
  text: string
  /** The safety-alert triangle is shown with every word except NOTICE. */
  alertSymbol: boolean
  /** Whether ISO 3864-2 has the same severity level. */
  inIso3864: boolean
}

export const SIGNAL_WORD_INFO: Readonly<Record<SignalWord, SignalWordInfo>> = {
  DANGER: {
    word: 'DANGER',
    rank: 4,
    harm: 'death or serious injury',
    likelihood: 'will',
    meaning: 'A hazard that will kill or seriously injure if it is not avoided. Kept for the most extreme cases.',
    colour: 'red',
    background: '#B3131B',
    text: '#FFFFFF',
    alertSymbol: true,
    inIso3864: true,
  },
  WARNING: {
    word: 'WARNING',
    rank: 3,
    harm: 'death or serious injury',
    likelihood: 'could',
    meaning: 'A hazard that could kill or seriously injure if it is not avoided.',
    colour: 'orange',
    background: '#F26A1B',
    text: '#000000',
    alertSymbol: true,
    inIso3864: true,
  },
  CAUTION: {
    word: 'CAUTION',
    rank: 2,
    harm: 'minor or moderate injury',
    likelihood: 'could',
    meaning: 'A hazard that could cause a minor or moderate injury if it is not avoided.',
    colour: 'yellow',
    background: '#FFD100',
    text: '#000000',
    alertSymbol: true,
    inIso3864: true,
  },
  NOTICE: {
    word: 'NOTICE',
    rank: 1,
    harm: 'property or equipment damage',
    likelihood: null,
    meaning: 'Practice that protects the machine, tooling or work. Not about personal injury.',
    colour: 'blue',
    background: '#0B5CAD',
    text: '#FFFFFF',
    alertSymbol: false,
    inIso3864: false,
  },
}

/** Signal words in order of severity, most severe first. */
export const SIGNAL_WORDS_BY_SEVERITY: readonly SignalWord[] = [...SIGNAL_WORDS]
  .sort((a, b) => SIGNAL_WORD_INFO[b].rank - SIGNAL_WORD_INFO[a].rank)
