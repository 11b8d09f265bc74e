// SPDX-License-Identifier: MIT
// placeholder: replaced by the sweep benchmark
int main() { return 0; }
