import { secureRouter } from '../secureRouter'
import {
  TRENDS_ROLES,
  trendsFilterSchema,
  trendsOptionsQuerySchema,
} from '../../../shared/api/trends'
import { trendsOptions, trendsReport } from './trends.service'
import { writeTrendsCsv } from './trends.csv'

/** Line health: read-only aggregates for plant managers, QA supervisors and administrators. */
const r = secureRouter('/api/trends')

r.get('/', { roles: TRENDS_ROLES, query: trendsFilterSchema }, ({ query }) => trendsReport(query))

r.get('/options', { roles: TRENDS_ROLES, query: trendsOptionsQuerySchema }, ({ query }) =>
  trendsOptions(query),
)

r.get('/export.csv', { roles: TRENDS_ROLES, query: trendsFilterSchema }, ({ query, res }) =>
  writeTrendsCsv(query, res),
)

export const trendsRouter = r
