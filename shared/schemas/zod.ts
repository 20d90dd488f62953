import { z } from 'zod/mini'
import { en } from 'zod/locales'

/**
 * The zod every schema here is built with: its mini build, whose functions tree-shake (a third
 * of the classic build's bytes and construction time on the Train screen's first load), with
 * the English messages the classic build sets up by itself. The config is global, so a field
 * without a message of its own reads the same in an API answer and under a form field. The app
 * imports zod from here only; shared/domain imports zod/mini itself (it imports nothing outside
 * its folder) and gets the messages once this module has run: at the server's start (config.ts)
 * and, in the client, with the schemas of every screen that parses a domain schema.
 */
z.config(en())

export { z }
