import { randomBytes } from 'node:crypto'
import pg from 'pg'

/**
 * Before each API test file: a database of its own, copied from the migrated template, so files
 * run in parallel without seeing each other's rows. Runs before the file imports the server.
 */
const admin = process.env.TEST_ADMIN_DATABASE_URL ?? 'postgres://postgres@127.0.0.1:54339/postgres'
const name = `ft_${randomBytes(6).toString('hex')}`
const client = new pg.Client({ connectionString: admin })
await client.connect()
await client.query(`CREATE DATABASE ${name} TEMPLATE filmtrail_template`)
await client.end()

const url = new URL(admin)
url.pathname = `/${name}`
process.env.DATABASE_URL = url.toString()
process.env.NODE_ENV = 'test'
process.env.JWT_SECRET ??= randomBytes(32).toString('hex')
process.env.PUBLIC_URL ??= 'http://127.0.0.1:5180'
process.env.LOGIN_RATE_LIMIT ??= '1000'
