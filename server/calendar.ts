/** The UTC calendar day of a moment as YYYY-MM-DD: how the server dates licences, paperwork and file names. */
export const utcDay = (moment: Date = new Date()): string => moment.toISOString().slice(0, 10)
