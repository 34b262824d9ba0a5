import { compileMessage } from './message-compiler'

// vue-i18n options: English fills in any key a language does not have yet, so a screen never
// shows a bare key. The key test (tests/unit/i18n/keys.test.ts) keeps every file complete.
export default defineI18nConfig(() => ({
  fallbackLocale: 'en',
  missingWarn: false,
  fallbackWarn: false,
  // In place of vue-i18n's own compiler, left out of the build (i18n/message-compiler.ts).
  messageCompiler: compileMessage,
}))
