// The same run on the three-node Galera cluster (npm run cluster:start): an app instance on each of two
// nodes, one instance killed and restarted, and node 1 killed with SIGKILL mid-run and brought back.
import 'fake-indexeddb/auto'
import { describeFaultSuite } from '../support/fault-suite'

describeFaultSuite('tamp_faults', { cluster: true })
