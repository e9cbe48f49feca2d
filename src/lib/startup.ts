// Modules with start-up steps, imported once by the middleware so their
// registerStartupStep calls run inside the server bundle.
import './library-index';
// better-auth and the principal resolver the middleware asks (src/lib/principal.ts).
import './auth';
// The local fake SMTP server, when SMTP_URL is unset.
import './mail/fake-smtp';
