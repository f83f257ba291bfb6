// Team exports and imports work in temporary folders that they remove themselves; a server that stopped
// half-way leaves its folder behind. At start, folders older than a day are removed: an export or import
// still running in another instance on the same machine is far younger than that.
import { sweepTransferTempDirs } from '../utils/transfer/temp-sweep'

export default defineNitroPlugin(() => {
  void sweepTransferTempDirs().catch(error => console.warn('[tallymark] could not sweep old temporary folders:', error))
})
