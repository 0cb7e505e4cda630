import { useRef, useState } from "react";
import { Form } from "react-router";
import { CheckboxField, Field, FormError, SelectField } from "~/components/Field";
import { cx } from "~/components/cx";
import {
  CATEGORIES,
  CATEGORY_LABELS,
  formatEra,
  formatPrice,
  formatWeight,
  SHIPPING_ZONE_LABELS,
  SHIPPING_ZONES,
  TWO_PERSON_LIFT_G,
} from "@shared/catalogue";
import { countryOptions } from "@shared/countries";
import { readItemForm, zoneField, type FieldErrors } from "@shared/listing-draft";
import { CURRENCY_CODES, isCurrency, parseEra, parsePrice, parseWeight } from "@shared/listing-input";
import { currencyAfterCountryChange } from "@shared/listing-currency";
import { Caution, Section } from "./Section";
import { SaveBar } from "./SaveBar";
import { useAutosave } from "./useAutosave";
import { issuesByField } from "./issues";

type Values = Record<string, string | boolean>;

export function ItemForm({
  listingId,
  values,
  errors: serverErrors = {},
  formError,
  published,
  busy,
  notice,
}: {
  listingId: string;
  values: Values;
  errors?: FieldErrors;
  formError?: string;
  published: boolean;
  busy: boolean;
  notice?: string;
}) {
  const formRef = useRef<HTMLFormElement>(null);
  const [live, setLive] = useState<Values>(values);
  const autosave = useAutosave(listingId);
  const errors: FieldErrors = { ...serverErrors, ...issuesByField(autosave.serverIssues, "item"), ...autosave.clientErrors };
  const v = (k: string) => (typeof values[k] === "string" ? values[k] : "");
  const on = (k: string) => values[k] === true;
  const liveText = (k: string) => (typeof live[k] === "string" ? live[k] : "");

  const onChange = (e: React.FormEvent<HTMLFormElement>) => {
    const form = formRef.current;
    if (!form) return;
    // The currency follows the country until the seller picks one (shared/listing-currency.ts).
    const currencySelect = form.elements.namedItem("currency");
    if (e.target instanceof HTMLSelectElement && e.target.name === "country" && currencySelect instanceof HTMLSelectElement) {
      const next = currencyAfterCountryChange(
        { country: liveText("country") || null, currency: liveText("currency") || "EUR" },
        { country: e.target.value || null, currency: currencySelect.value },
      );
      if (next !== currencySelect.value && [...currencySelect.options].some((o) => o.value === next)) currencySelect.value = next;
    }
    const data = new FormData(form);
    setLive(Object.fromEntries([...data.entries()].map(([k, x]) => [k, typeof x === "string" ? x : ""])));
    autosave.schedule(() => {
      const r = readItemForm(new FormData(form));
      return r.ok ? { ok: true, body: { item: r.value } } : r;
    });
  };

  const typedCurrency = liveText("currency");
  const currency = isCurrency(typedCurrency) ? typedCurrency : "EUR";
  const price = liveText("price").trim() ? parsePrice(liveText("price"), currency) : null;
  const era = parseEra(liveText("era"));
  const weight = parseWeight(liveText("weight"));
  const heavy = weight.ok && weight.value !== null && weight.value >= TWO_PERSON_LIFT_G;

  return (
    <Form method="post" ref={formRef} onChange={onChange} className="space-y-5" noValidate aria-label="Item details">
      <FormError>{formError}</FormError>
      <Section title="The unit" lede="What buyers search for. The serial number stays private.">
        <div className="grid gap-4 sm:grid-cols-2">
          <SelectField
            label="Kind of unit"
            name="category"
            defaultValue={v("category")}
            options={CATEGORIES.map((c) => ({ value: c, label: CATEGORY_LABELS[c].one }))}
            error={errors.category}
            disabled={published}
            hint={published ? "Fixed once the listing is published." : undefined}
          />
          {published ? <input type="hidden" name="category" value={v("category")} /> : null}
          <Field
            label="Year or era"
            name="era"
            defaultValue={v("era")}
            placeholder="1978, 1975–79 or 1970s"
            error={errors.era}
            optional
            hint={
              era.ok && (era.value.from || era.value.to)
                ? `Shown as ${formatEra(era.value.from, era.value.to)}`
                : "A year, a span or a decade."
            }
          />
          <Field label="Maker" name="maker" defaultValue={v("maker")} maxLength={80} autoComplete="off" error={errors.maker} />
          <Field label="Model" name="model" defaultValue={v("model")} maxLength={80} autoComplete="off" error={errors.model} />
          <Field
            label="Serial number"
            name="serialNumber"
            defaultValue={v("serialNumber")}
            maxLength={80}
            autoComplete="off"
            optional
            error={errors.serialNumber}
            hint="Never shown on the listing. Kept for disputes and theft checks."
            className="sm:col-span-2"
          />
        </div>
      </Section>

      <Section
        title="Mains"
        lede="What the unit is set for today. A unit set for another country's mains must be changed over by a technician before use."
      >
        <div className="grid gap-4 sm:grid-cols-3">
          <Field
            label="Mains voltage"
            name="mainsVoltageV"
            unit="V"
            inputMode="numeric"
            list="mains-voltages"
            defaultValue={v("mainsVoltageV")}
            optional
            error={errors.mainsVoltageV}
          />
          <datalist id="mains-voltages">
            {[100, 110, 115, 117, 120, 127, 220, 230, 240].map((x) => (
              <option key={x} value={x} />
            ))}
          </datalist>
          <SelectField
            label="Frequency"
            name="mainsFrequencyHz"
            defaultValue={v("mainsFrequencyHz")}
            placeholder="Not stated"
            options={[
              { value: "50", label: "50 Hz" },
              { value: "60", label: "60 Hz" },
            ]}
            optional
            error={errors.mainsFrequencyHz}
          />
          <CheckboxField
            label="Voltage selector on the unit"
            name="mainsSwitchable"
            defaultChecked={on("mainsSwitchable")}
            hint="Switchable between mains voltages."
            className="sm:pt-7"
          />
        </div>
      </Section>

      <Section title="Weight and box" lede="Carriers price by the larger of real and volumetric weight; give the packed box's size.">
        <div className="grid gap-4 sm:grid-cols-4">
          <Field
            label="Weight"
            name="weight"
            unit="kg"
            inputMode="decimal"
            defaultValue={v("weight")}
            error={errors.weight}
            hint={weight.ok && weight.value ? formatWeight(weight.value) : "The unit alone."}
          />
          <Field
            label="Box length"
            name="boxedLength"
            unit="cm"
            inputMode="decimal"
            defaultValue={v("boxedLength")}
            optional
            error={errors.boxedLength}
          />
          <Field
            label="Box width"
            name="boxedWidth"
            unit="cm"
            inputMode="decimal"
            defaultValue={v("boxedWidth")}
            optional
            error={errors.boxedWidth}
          />
          <Field
            label="Box height"
            name="boxedHeight"
            unit="cm"
            inputMode="decimal"
            defaultValue={v("boxedHeight")}
            optional
            error={errors.boxedHeight}
          />
        </div>
        <Caution
          title={heavy ? "Heavy unit: two people and freight packing" : "Units of 30 kg and more"}
          className={cx(!heavy && "opacity-90")}
        >
          <p>Lifting 30 kg or more takes two people: lift with bent knees and hold the chassis, never the knobs or the front panel.</p>
          <p>
            Ship such units as freight: strapped to a pallet or double-boxed with at least 5 cm of firm foam on every side, transformers and
            heatsinks braced, feet off the floor of the box. Most parcel carriers refuse them.
          </p>
        </Caution>
      </Section>

      <Section title="What comes with it">
        <div className="grid gap-3 sm:grid-cols-3">
          <CheckboxField label="Owner's manual" name="includesManual" defaultChecked={on("includesManual")} />
          <CheckboxField label="Remote control" name="includesRemote" defaultChecked={on("includesRemote")} />
          <CheckboxField label="Original packing" name="includesOriginalPacking" defaultChecked={on("includesOriginalPacking")} />
        </div>
      </Section>

      <Section title="Price">
        <div className="grid gap-4 sm:grid-cols-3">
          <Field
            label="Asking price"
            name="price"
            inputMode="decimal"
            unit={currency}
            defaultValue={v("price")}
            placeholder="1250"
            error={errors.price}
            hint={price?.ok ? `Buyers see ${formatPrice(price.value, currency)}` : "Type it as you would write it: 1250 or 1,250.00."}
            className="sm:col-span-2"
          />
          <SelectField
            label="Currency"
            name="currency"
            defaultValue={v("currency") || "EUR"}
            options={CURRENCY_CODES.map((c) => ({ value: c, label: c }))}
            error={errors.currency}
          />
          <CheckboxField
            label="Offers welcome"
            name="offersWelcome"
            defaultChecked={on("offersWelcome")}
            hint="Buyers may offer less; you answer each offer."
            className="sm:col-span-3"
          />
        </div>
      </Section>

      <Section title="Where it is" lede="Buyers see the town and region. The postcode is only for shipping quotes.">
        <div className="grid gap-4 sm:grid-cols-2">
          <SelectField
            label="Country"
            name="country"
            defaultValue={v("country")}
            placeholder="Choose…"
            options={countryOptions()}
            error={errors.country}
          />
          <Field label="Region" name="region" defaultValue={v("region")} maxLength={80} optional error={errors.region} />
          <Field label="Town" name="town" defaultValue={v("town")} maxLength={80} optional error={errors.town} />
          <Field
            label="Postcode"
            name="postcode"
            defaultValue={v("postcode")}
            maxLength={12}
            optional
            error={errors.postcode}
            hint="Not shown on the listing."
          />
        </div>
      </Section>

      <Section title="Shipping" lede={`Leave a zone blank where you do not send. Prices in ${currency}; 0 for free.`}>
        {errors.shipping ? <FormError>{errors.shipping}</FormError> : null}
        <div className="space-y-2">
          <CheckboxField
            label="Collection in person"
            name="collection"
            defaultChecked={on("collection")}
            hint="The buyer collects and can hear the unit first."
          />
          <Field
            label="Collection note"
            name="collectionNote"
            defaultValue={v("collectionNote")}
            maxLength={200}
            optional
            placeholder="Weekdays after 5 pm; ground floor"
            error={errors.collectionNote}
          />
        </div>
        {(["parcel", "freight"] as const).map((method) => (
          <fieldset key={method} className="space-y-2">
            <legend className="text-sm font-semibold text-ink">{method === "parcel" ? "Parcel, insured" : "Freight on a pallet"}</legend>
            <div className="grid gap-3 sm:grid-cols-3">
              {SHIPPING_ZONES.map((zone) => (
                <Field
                  key={zone}
                  label={SHIPPING_ZONE_LABELS[zone]}
                  name={zoneField(method, zone)}
                  inputMode="decimal"
                  unit={currency}
                  defaultValue={v(zoneField(method, zone))}
                  optional
                  error={errors[zoneField(method, zone)]}
                />
              ))}
            </div>
          </fieldset>
        ))}
        <Field
          label="Handling time"
          name="handlingDays"
          unit="days"
          inputMode="numeric"
          defaultValue={v("handlingDays")}
          error={errors.handlingDays}
          hint="Working days from payment to dispatch; packing a heavy unit properly takes time."
          className="max-w-xs"
        />
      </Section>

      <SaveBar state={autosave.state} busy={busy} notice={notice} next={{ label: "Save and go to condition" }} />
    </Form>
  );
}
