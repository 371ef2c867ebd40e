// Five crew leads' phones send 1000 records of every kind through the real outbox engine while the
// network loses answers, the server is killed and the database stopped (tests/support/fault-suite.ts).
// The database is the suite's own MariaDB, or TAMP_FAULTS_DB=host:port[,host:port] (see fault-database.ts).
import 'fake-indexeddb/auto'
import { describeFaultSuite } from '../support/fault-suite'

describeFaultSuite('tamp_faults')
