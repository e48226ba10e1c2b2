package org.lrbench.cli;

import java.nio.file.Files;
import java.nio.file.Path;
import org.lrbench.store.ResultStore;
import picocli.CommandLine.Option;

/** {@code --data} and {@code --store}: the results store, a file in a folder or a shared server. */
final class StoreLocation {

    @Option(names = "--data", paramLabel = "DIR", defaultValue = "data",
            description = "folder of the results store, DIR/lrbench.db (default: ${DEFAULT-VALUE})")
    Path data;

    @Option(names = "--store", paramLabel = "URL",
            description = "a store shared by several benches instead of DIR/lrbench.db: jdbc:postgresql://HOST:PORT/DB?user=U")
    String url;

    Path file() {
        return data.resolve("lrbench.db");
    }

    /** Whether there is a store to read: a server, or the file. */
    boolean exists() {
        return url != null || Files.isRegularFile(file());
    }

    /** Opened for recording (created and migrated when new). */
    ResultStore open() {
        return url != null ? ResultStore.openUrl(url) : ResultStore.open(file());
    }

    /** Opened for reading: a store on read-only media, or a copy handed to an auditor, is read as it is. */
    ResultStore openForReading() {
        if (url != null) {
            return ResultStore.openUrl(url);
        }
        if (!Files.isRegularFile(file())) {
            throw new BadInputException("no results store at " + file() + " (measure a lot first, or give --data)");
        }
        return ResultStore.openForReading(file());
    }
}
