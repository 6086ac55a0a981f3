// The whole domain of the product, modelled up front so later work adds behaviour, not upheaval.
// Times are ISO-8601 strings (UTC); ids are random UUIDs unless a table says otherwise.
// The tables are in several files (under 350 lines each); drizzle-kit and the code read them all here.
export * from './schema/accounts';
export * from './schema/core';
export * from './schema/records';
export * from './schema/competition';
