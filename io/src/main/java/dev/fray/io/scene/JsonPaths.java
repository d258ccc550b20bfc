package dev.fray.io.scene;

/** Builds the JSON paths that error messages use: {@code bodies[0].material.youngsModulus}; the root is "". */
final class JsonPaths {
    private JsonPaths() {
    }

    /**
     * @param parent path of the object, "" for the root
     * @param key    member name
     * @return the member's path
     */
    static String member(String parent, String key) {
        return parent.isEmpty() ? key : parent + "." + key;
    }

    /**
     * @param parent path of the list
     * @param index  item index
     * @return the item's path
     */
    static String index(String parent, int index) {
        return parent + "[" + index + "]";
    }

    /**
     * @param path a path
     * @return the path as shown to users; the root is called "(top level)"
     */
    static String shown(String path) {
        return path.isEmpty() ? "(top level)" : path;
    }
}
