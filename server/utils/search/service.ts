// The one search service of this server process, created on first use with the app's database pool.
import { useDb } from '../db'
import { searchConfigFromEnv } from './config'
import { SearchService } from './manager'

let service: SearchService | undefined

export function useSearchService(): SearchService {
  service ??= new SearchService(useDb(), searchConfigFromEnv()).start()
  return service
}
