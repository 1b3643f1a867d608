/** The weekly calendar, aggregation of dated lines and gap filling (see each file). */
export * from './aggregate';
export * from './calendar';
export * from './gaps';
