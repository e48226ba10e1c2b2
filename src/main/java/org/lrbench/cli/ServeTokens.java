package org.lrbench.cli;

import java.io.IOException;
import java.nio.file.Path;

/** Access to the service's token file for tests and tools. */
public final class ServeTokens {

    private ServeTokens() {
    }

    /** The access token kept in DIR/service-token, made on first use, readable by its owner only. */
    public static String token(Path data) throws IOException {
        return ServeCommand.token(data);
    }
}
