// The main thread's side of the search worker (server/workers/search.ts): every call is a message to the
// worker, which holds the team indexes on its own core and heap; the answer comes back as a message. If the
// worker dies, calls in flight are tried once more on a new one.
import { Worker } from 'node:worker_threads'
import type { SearchParams } from '../../../shared/search/schema'
import type { SearchResponse } from '../../../shared/search/types'
import { searchOnChange } from './changes'
import type { SearchStats } from './manager'

export type SearchWorkerRequest
  = | { id: number, op: 'search' | 'searchJson', team: { id: number, slug: string }, params: SearchParams }
    | { id: number, op: 'ready', teamId: number }
    | { id: number, op: 'stats' }
    | { id: number, op: 'poll' }
    | { op: 'changed' }

/** An error crosses as its message plus the codes that tell a database outage (server/utils/db-errors.ts). */
export interface SearchWorkerError { message: string, code?: string, errno?: number }
export type SearchWorkerReply = { id: number, ok: true, value: unknown } | { id: number, ok: false, error: SearchWorkerError }

export interface SearchWorkerData { databaseUrl: string }

class WorkerGone extends Error {}

type WithoutId<T> = T extends unknown ? Omit<T, 'id'> : never
type Call = WithoutId<Exclude<SearchWorkerRequest, { op: 'changed' }>>

export class SearchWorkerClient {
  private worker: Worker | null = null
  private nextId = 1
  private readonly pending = new Map<number, { resolve: (value: unknown) => void, reject: (error: Error) => void }>()
  private unsubscribe: (() => void) | null = null

  constructor(private readonly file: string | URL, private readonly databaseUrl: string, private readonly log: (message: string, error?: unknown) => void = console.error) {}

  start(): this {
    // Writes of this process wake the worker's change-log reader at once (other instances' writes: its polling).
    this.unsubscribe ??= searchOnChange(() => this.worker?.postMessage({ op: 'changed' } satisfies SearchWorkerRequest))
    return this
  }

  stop(): void {
    this.unsubscribe?.()
    this.unsubscribe = null
    void this.worker?.terminate()
    this.worker = null
  }

  search(team: { id: number, slug: string }, params: SearchParams): Promise<SearchResponse> {
    return this.call({ op: 'search', team: { id: team.id, slug: team.slug }, params }) as Promise<SearchResponse>
  }

  /** The answer as JSON text, for the route to send as it is. */
  searchJson(team: { id: number, slug: string }, params: SearchParams): Promise<string> {
    return this.call({ op: 'searchJson', team: { id: team.id, slug: team.slug }, params }) as Promise<string>
  }

  async ready(teamId: number): Promise<void> {
    await this.call({ op: 'ready', teamId })
  }

  stats(): Promise<SearchStats> {
    return this.call({ op: 'stats' }) as Promise<SearchStats>
  }

  async poll(): Promise<void> {
    await this.call({ op: 'poll' })
  }

  private async call(request: Call, retried = false): Promise<unknown> {
    try {
      return await this.send(request)
    }
    catch (error) {
      if (error instanceof WorkerGone && !retried) return await this.call(request, true)
      throw error
    }
  }

  private send(request: Call): Promise<unknown> {
    const worker = this.worker ?? this.spawn()
    const id = this.nextId++
    return new Promise((resolve, reject) => {
      this.pending.set(id, { resolve, reject })
      // Only calls in flight keep the process alive, not the worker itself.
      if (this.pending.size === 1) worker.ref()
      worker.postMessage({ ...request, id } as SearchWorkerRequest)
    })
  }

  private settle(id: number): { resolve: (value: unknown) => void, reject: (error: Error) => void } | undefined {
    const call = this.pending.get(id)
    this.pending.delete(id)
    if (!this.pending.size) this.worker?.unref()
    return call
  }

  private spawn(): Worker {
    const worker = new Worker(this.file, { workerData: { databaseUrl: this.databaseUrl } satisfies SearchWorkerData })
    worker.unref()
    worker.on('message', (reply: SearchWorkerReply) => {
      const call = this.settle(reply.id)
      if (!call) return
      if (reply.ok) call.resolve(reply.value)
      else call.reject(Object.assign(new Error(reply.error.message), { code: reply.error.code, errno: reply.error.errno }))
    })
    worker.on('error', error => this.log('[search] the search worker failed', error))
    worker.on('exit', () => {
      if (this.worker === worker) this.worker = null
      const calls = [...this.pending.values()]
      this.pending.clear()
      for (const call of calls) call.reject(new WorkerGone('The search worker stopped.'))
    })
    this.worker = worker
    return worker
  }
}
