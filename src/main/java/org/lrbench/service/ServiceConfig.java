package org.lrbench.service;

import java.nio.file.Path;

/**
 * Where a bench service finds its bench, drivers, plans and simulated lots, and keeps its data;
 * {@code storeUrl} names a shared store (PostgreSQL) instead of DATA/lrbench.db, or is null.
 */
public record ServiceConfig(Path benchFile, Path drivers, Path plans, Path simulator, Path data, Path runs,
                            Path calibration, String programVersion, String storeUrl) {

    /** A service with its own SQLite store in the data folder. */
    public ServiceConfig(Path benchFile, Path drivers, Path plans, Path simulator, Path data, Path runs,
                         Path calibration, String programVersion) {
        this(benchFile, drivers, plans, simulator, data, runs, calibration, programVersion, null);
    }
}
