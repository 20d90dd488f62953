import { dirname, join, resolve } from 'node:path'
import { loadConfig } from '../config'
import { backup, integrityCheck, restore } from './backup'
import { openDatabase } from './index'

/**
 * `npm run backup` writes data/backups/chalkline-<time>/ (database + uploads).
 * `npm run restore -- <backup folder>` puts one back (stop the server first).
 */
const config = loadConfig()
const [command, target] = process.argv.slice(2)
const backupsRoot = join(dirname(config.databasePath), 'backups')

if (command === 'backup') {
  const sequelize = await openDatabase(config.databasePath)
  const dir = await backup(sequelize, config.uploads.dir, backupsRoot)
  await sequelize.close()
  console.log(`Backup written to ${dir}`)
} else if (command === 'restore') {
  if (!target) {
    console.error('Name the backup folder: npm run restore -- data/backups/chalkline-<time>')
    process.exit(1)
  }
  restore(resolve(target), config.databasePath, config.uploads.dir)
  const sequelize = await openDatabase(config.databasePath)
  const check = await integrityCheck(sequelize)
  await sequelize.close()
  console.log(`Restored ${target} (integrity check: ${check})`)
  if (check !== 'ok') process.exit(1)
} else {
  console.error('Use: backup-cli.ts backup | restore <folder>')
  process.exit(1)
}
