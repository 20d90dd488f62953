import { Umzug, type MigrationParams } from 'umzug'
import { SequelizeStorage } from 'umzug'
import type { QueryInterface, Sequelize } from 'sequelize'
import * as initialSchema from './migrations/0001-initial-schema'
import * as sessionRunner from './migrations/0002-session-runner'
import * as passwordResets from './migrations/0003-password-resets'
import * as coachReview from './migrations/0004-coach-review'
import * as queryIndexes from './migrations/0005-query-indexes'
import * as sledExercises from './migrations/0006-sled-exercises'
import * as progressEngine from './migrations/0007-progress-engine'

type Migration = {
  name: string
  up: (p: MigrationParams<QueryInterface>) => Promise<void>
  down: (p: MigrationParams<QueryInterface>) => Promise<void>
}

/** Listed by hand (not globbed) so the same list works under tsx and in the bundle. */
const migrations: Migration[] = [
  { name: '0001-initial-schema', ...initialSchema },
  { name: '0002-session-runner', ...sessionRunner },
  { name: '0003-password-resets', ...passwordResets },
  { name: '0004-coach-review', ...coachReview },
  { name: '0005-query-indexes', ...queryIndexes },
  { name: '0006-sled-exercises', ...sledExercises },
  { name: '0007-progress-engine', ...progressEngine },
]

export function createMigrator(sequelize: Sequelize) {
  return new Umzug({
    migrations,
    context: sequelize.getQueryInterface(),
    storage: new SequelizeStorage({ sequelize, tableName: 'schema_migrations' }),
    logger: undefined,
  })
}

export async function migrate(sequelize: Sequelize) {
  await createMigrator(sequelize).up()
}
