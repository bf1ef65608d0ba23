export { type CaughtMessage, type MailCatcher, startMailCatcher } from "./mail-catcher";
