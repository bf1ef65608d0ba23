// Imports every feature's job module so that its defineJob calls run. Add one line per feature.
import "@/mail/mail.jobs";
import "@/uploads/uploads.jobs";
import "@/suggestions/suggestions.jobs";
import "@/training/training.jobs";
