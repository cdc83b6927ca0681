// Package e2e is the browser suite: the built site served on 127.0.0.1,
// driven in Debian's Chromium through chromedp, and checked for what a user
// sees. It has only tests; `make e2e` (part of `make test`) runs it.
//
// On a failure each test writes a screenshot and the page's console to
// test-evidence/<TestName>/ at the top of the repository, and the failure
// message names that folder.
package e2e
