import { Fragment, defineComponent, h } from 'vue'
import { messageParts } from '#shared/i18n/render'

// A message whose placeholders are filled with elements, not text: each `{name}` shows the slot
// of that name (`<UiMessage keypath="floor.running"><template #who>…`). With `tag` the parts are
// wrapped in that element (and take its class); without, they stand alone.
export default defineComponent({
  name: 'UiMessage',
  props: { keypath: { type: String, required: true }, tag: { type: String, default: undefined } },
  setup(props, { slots }) {
    const { message } = useI18n()
    return () => {
      const parts = messageParts(message(props.keypath)).map(p => typeof p === 'string' ? p : slots[p.name]?.())
      return props.tag ? h(props.tag, parts) : h(Fragment, parts)
    }
  },
})
