/** The command line: demo, check, run. */
package org.lrbench.cli;
