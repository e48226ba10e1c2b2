/** The results store: every part result committed as it completes, lots and their dispositions. */
package org.lrbench.store;

