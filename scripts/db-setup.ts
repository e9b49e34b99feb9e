// Applies migrations and seeds the demo practice once. Run by `npm start` before the
// server starts, and by `npm run db:migrate` (with --no-seed).
import { openDatabase } from '../server/db/client'
import { hashPasswordOffline } from '../server/db/hash'
import { applyMigrations } from '../server/db/migrate'
import { seedDemo } from '../server/db/seed'

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
  }
}
finally {
  await close()
}
