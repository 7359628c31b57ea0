/** The pg-boss queue of log parses; a job's id is the id of the log it parses. */
export const PARSE_LOG_QUEUE = 'parse-log';
