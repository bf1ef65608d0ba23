export { type CaughtMessage, type MailCatcher, startMailCatcher } from "./mail-catcher";
export { type Delivery, type FakeEvent, type PaymentsFake, type PaymentsFakeOptions, startPaymentsFake } from "./payments/payments-fake";
export { signPayload } from "./payments/signature";
