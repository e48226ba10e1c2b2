package org.lrbench.service;

import java.nio.file.Path;

/**
 * Where a bench service finds its bench, drivers, plans and simulated lots, and keeps its data;
 * {@code storeUrl} names a shared store (PostgreSQL) instead of DATA/lrbench.db, or is null;
 * {@code samplingTables} holds the lab's ISO 2859-1 Tables II-B and II-C for the switching rules.
 */
public record ServiceConfig(Path benchFile, Path drivers, Path plans, Path simulator, Path data, Path runs,
                            Path calibration, String programVersion, String storeUrl, Path samplingTables) {

    /** A service with its own SQLite store in the data folder, the lab's tables in ./sampling. */
    public ServiceConfig(Path benchFile, Path drivers, Path plans, Path simulator, Path data, Path runs,
                         Path calibration, String programVersion) {
        this(benchFile, drivers, plans, simulator, data, runs, calibration, programVersion, null, Path.of("sampling"));
    }

    /** As above with a store URL (null: DATA/lrbench.db). */
    public ServiceConfig(Path benchFile, Path drivers, Path plans, Path simulator, Path data, Path runs,
                         Path calibration, String programVersion, String storeUrl) {
        this(benchFile, drivers, plans, simulator, data, runs, calibration, programVersion, storeUrl, Path.of("sampling"));
    }
}
