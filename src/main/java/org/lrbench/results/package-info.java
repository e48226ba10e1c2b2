/** Result records and writing them safely under runs/. */
package org.lrbench.results;
