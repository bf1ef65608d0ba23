// Imports each feature's fixture extension (one line per feature) so that buildTenantFixture
// creates its objects. Keep this list in the order features were added.
import "./fixtures/annotation";
import "./fixtures/corpora";
import "./fixtures/api-tokens";
import "./fixtures/training";
export {};
