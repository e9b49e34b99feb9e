// Applies migrations and seeds the demo practice once. Run by `npm start` before the
// server starts, and by `npm run db:migrate` (with --no-seed).
import { openDatabase } from '../server/db/client'
import { hashPasswordOffline } from '../server/db/hash'
import { applyMigrations } from '../server/db/migrate'
import { seedDemo } from '../server/db/seed'
import { DEMO_PASSWORD, DEMO_PEOPLE, DEMO_PRACTICE } from '../server/db/demo'
import { ROLE_LABELS } from '../shared/permissions'

function printDemoAccounts() {
  console.log(`\n  Demo accounts of ${DEMO_PRACTICE.name} (invented), password: ${DEMO_PASSWORD}`)
  for (const person of DEMO_PEOPLE) console.log(`    ${ROLE_LABELS[person.role].padEnd(14)} ${person.email}`)
  console.log('')
}

const { db, close } = openDatabase()
try {
  await applyMigrations(db)
  console.log('  database: migrations applied')
  if (!process.argv.includes('--no-seed')) {
    const outcome = await seedDemo(db, hashPasswordOffline)
    console.log({
      'seeded': '  database: demo practice created',
      'already-seeded': '  database: demo practice already there (not seeded again)',
      'skipped-real-data': '  database: holds practices already; demo not seeded over them',
    }[outcome])
    if (outcome !== 'skipped-real-data') printDemoAccounts()
  }
}
finally {
  await close()
}
