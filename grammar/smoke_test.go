package grammar

import "testing"

func TestSmoke(t *testing.T) {
	f, err := ParseString("x.gsr", `# comment
use "units.gsr"
use stock terms

# modifiers
modifier = ADJ | NOUN | PROPN | VERB & tag:VBN ;
term     = modifier* NOUN ;
of_term  = term "of" DET? term ;
verb_obj = @verb VERB DET? ADJ* @object NOUN ;
x = !ADJ & tag:/^VB/ (a b){2,3} ^ $ tag:PRP$ 'Valve' shape:Xx-d;
expect term: "the [stainless steel valve body] cracked" ;   # this span must match
reject term: "they left quickly" ;
bad = NUON lema:x ;
y = ( ;
z = NOUN ;
`)
	t.Log(err)
	if el, ok := err.(ErrorList); ok {
		t.Log(el.Format())
	}
	for _, r := range f.Rules {
		t.Logf("%s [%s] = %s", r.Name, r.Doc, Format(r.Expr))
	}
	for _, e := range f.Examples {
		t.Logf("%+v", e)
	}
	for _, u := range f.Uses {
		t.Logf("%+v", u)
	}
	rs, err := LoadStock(StockNames()...)
	if err != nil {
		t.Fatal(err.(ErrorList).Format())
	}
	for _, r := range rs.Rules {
		t.Logf("%s = %s", r.Name, Format(r.Expr))
	}
}
