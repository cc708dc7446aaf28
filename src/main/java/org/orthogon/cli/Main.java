package org.orthogon.cli;

public final class Main {
    public static void main(String[] args) {
        System.setProperty("java.awt.headless", "true");
    }
}
