/** Entry file of the service host process (see ./service-host); the shell starts this file. */
import { hostMain } from './service-host';

void hostMain(process.argv.slice(2));
