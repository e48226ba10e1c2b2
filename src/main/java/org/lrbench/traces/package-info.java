/** Traces from files: two-channel text files from any scope or circuit simulator, re-analysed. */
package org.lrbench.traces;
