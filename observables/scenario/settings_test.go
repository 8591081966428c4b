package scenario

import "testing"

// TestMethodByName: every accepted numerics.method name resolves to the
// pair of the orders its name states (Dormand & Prince 1980 for 5(4),
// Prince & Dormand 1981 with Hairer, Nørsett & Wanner 1993 §II.10 for
// 8(5,3), Tsitouras 2011 for 5(4)), "" to the default, and anything else
// is an input error.
func TestMethodByName(t *testing.T) {
	want := map[string][2]int{
		MethodDormandPrince8: {8, 5},
		MethodDormandPrince5: {5, 4},
		MethodTsitouras5:     {5, 4},
		"":                   {8, 5},
	}
	if len(MethodNames) != 3 {
		t.Fatalf("MethodNames = %v, want the three built-in pairs", MethodNames)
	}
	for _, name := range append([]string{""}, MethodNames...) {
		tab, err := MethodByName(name)
		if err != nil {
			t.Fatalf("MethodByName(%q): %v", name, err)
		}
		if got := [2]int{tab.Order, tab.EmbeddedOrder}; got != want[name] {
			t.Errorf("MethodByName(%q): orders %v, want %v", name, got, want[name])
		}
	}
	if _, err := MethodByName("rk45"); err == nil {
		t.Error("MethodByName(\"rk45\"): no error for an unknown name")
	}
}
