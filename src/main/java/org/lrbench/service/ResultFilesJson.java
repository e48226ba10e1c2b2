package org.lrbench.service;

import com.fasterxml.jackson.databind.JsonNode;
import java.io.IOException;
import org.lrbench.results.ResultFiles;

/** Stored result JSON as a tree, to embed in API replies as it was written. */
final class ResultFilesJson {

    private ResultFilesJson() {
    }

    static String write(Object value) {
        try {
            return ResultFiles.JSON.writeValueAsString(value);
        } catch (IOException e) {
            throw new IllegalStateException(e);
        }
    }

    static JsonNode tree(String json) {
        try {
            return ResultFiles.JSON.readTree(json);
        } catch (IOException e) {
            throw new ServiceException(500, "a stored result is unreadable");
        }
    }
}
