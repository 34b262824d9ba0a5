// The npm G-code toolpath library ships without type declarations; only what the tests use.
declare module 'gcode-toolpath' {
  interface Vec3 { x: number, y: number, z: number }
  interface Modal { motion: string, units: string, spindle: string, program: string, feedrate: string, [key: string]: unknown }
  interface ParsedLine { line: string, words: [string, number][], cmds?: string[], comments?: string[] }
  export default class Toolpath {
    constructor(options?: {
      position?: Partial<Vec3>
      modal?: Partial<Modal>
      addLine?: (modal: Modal, v1: Vec3, v2: Vec3) => void
      addArcCurve?: (modal: Modal, v1: Vec3, v2: Vec3, v0: Vec3) => void
    })
    // The constructor hands back its interpreter, which exposes these accessors.
    getModal(): Modal
    getPosition(): Vec3
    loadFromStringSync(text: string, callback?: (line: ParsedLine, index: number) => void): ParsedLine[]
  }
}
