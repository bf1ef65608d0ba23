/**
 * Entry point of the tagger's command line (`pnpm tagger …` runs this file); the commands live
 * in cli/main.ts.
 */
import { main } from "./cli/main";

process.exitCode = main(process.argv.slice(2));
