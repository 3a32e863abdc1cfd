// An empty program linked with the whole archive of one layer and only the layers below it
// (CMakeLists.txt, slipscreen_layer): it fails to link when the layer calls a layer above.
int main() { return 0; }
