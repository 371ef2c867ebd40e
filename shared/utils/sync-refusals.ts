// Why the sync route refuses or holds back a change: a stable code the phone translates
// (`server.sync.<code>` in its locale files) and the English words the server sends with it.
export const syncRefusals = {
  planOnly: 'Only the foreman or the office can change the job\'s plan',
  zonesByOffice: 'Zones are removed by the office from the job setup',
  noSuchJob: 'No such job',
  sheetMissing: 'The day sheet of this entry is not on the server',
  cannotMove: 'This entry cannot move to another day, job, zone or person',
  approved: 'The foreman approved this day; ask them to reopen it to change it',
  wrongZone: 'That zone is not part of this job',
  notOnRoster: 'That person is not on the crew roster',
  alreadyRemoved: 'Already removed',
  removedOnServer: 'This entry was removed on the server',
  sheetExists: 'This job already has a day sheet for that date',
  hoursExist: 'This person already has hours on this day',
  quantityExists: 'This zone already has a quantity at this stage on this day',
  estimateExists: 'The estimate already has this material in this unit',
  answerSent: 'An answer cannot be changed once sent; send another one',
  flagMissing: 'This flag is not on the server',
} as const
export type SyncRefusal = keyof typeof syncRefusals

/** The code and message of a refusal, to spread into a sync result. */
export function refusal(code: SyncRefusal): { code: string, message: string } {
  return { code: `sync.${code}`, message: syncRefusals[code] }
}
