/** Step keys are stable ids that runs refer to, so they stay short, lower-case and URL-safe. */
export const STEP_KEY_PATTERN = /^[a-z0-9]+(?:-[a-z0-9]+)*$/
