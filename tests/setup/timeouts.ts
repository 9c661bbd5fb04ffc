import { configure } from '@testing-library/dom';

// A loaded machine (CI, or several suites at once) can take seconds to load a lazy route chunk:
// wait up to 10 s for what a test expects to appear, instead of the library's 1 s.
configure({ asyncUtilTimeout: 10_000 });
