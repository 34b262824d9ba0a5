import wasmUrl from 'zxing-wasm/reader/zxing_reader.wasm?url'

// Reads QR codes from the tablet's camera: the browser's own BarcodeDetector where it has one
// that reads QR, else the barcode-detector polyfill (zxing-wasm), whose WASM file is shipped
// with the app and served from our origin (never a CDN), and precached for offline.

interface Detector { detect: (source: CanvasImageSource) => Promise<{ rawValue: string }[]> }

async function makeDetector(): Promise<Detector> {
  const native = (globalThis as { BarcodeDetector?: { new (o: { formats: string[] }): Detector, getSupportedFormats: () => Promise<string[]> } }).BarcodeDetector
  if (native && (await native.getSupportedFormats().catch((): string[] => [])).includes('qr_code')) return new native({ formats: ['qr_code'] })
  const { BarcodeDetector, setZXingModuleOverrides } = await import('barcode-detector/ponyfill')
  setZXingModuleOverrides({ locateFile: (path: string, prefix: string) => (path.endsWith('.wasm') ? wasmUrl : prefix + path) })
  return new BarcodeDetector({ formats: ['qr_code'] })
}

export function useTagScanner(video: Ref<HTMLVideoElement | null>, onCode: (text: string) => void) {
  const state = ref<'idle' | 'starting' | 'scanning' | 'no-camera'>('idle')
  const problem = ref('')
  const { t } = useI18n()
  let stream: MediaStream | null = null
  let timer: ReturnType<typeof setTimeout> | undefined
  let stopped = false

  async function start() {
    stopped = false
    state.value = 'starting'
    problem.value = ''
    try {
      stream = await navigator.mediaDevices.getUserMedia({ video: { facingMode: 'environment' }, audio: false })
    }
    catch (e: any) {
      state.value = 'no-camera'
      problem.value = e?.name === 'NotAllowedError'
        ? t('paper.scan.blocked')
        : t('paper.scan.noCamera')
      return
    }
    if (stopped || !video.value) return stop()
    video.value.srcObject = stream
    await video.value.play().catch(() => {})
    const detector = await makeDetector()
    state.value = 'scanning'
    // A few reads a second are plenty for a tag held still, and spare the tablet's battery.
    const tick = async () => {
      if (stopped || !video.value) return
      if (video.value.readyState >= 2) {
        const found = await detector.detect(video.value).catch(() => [])
        if (found[0] && !stopped) onCode(found[0].rawValue)
      }
      if (!stopped) timer = setTimeout(tick, 250)
    }
    tick()
  }

  function stop() {
    stopped = true
    clearTimeout(timer)
    stream?.getTracks().forEach(t => t.stop())
    stream = null
    if (state.value !== 'no-camera') state.value = 'idle'
  }

  onBeforeUnmount(stop)
  return { state, problem, start, stop }
}
