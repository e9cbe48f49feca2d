// Modules with start-up steps, imported once by the middleware so their
// registerStartupStep calls run inside the server bundle.
import './library-index';
